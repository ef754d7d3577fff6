/** Crew notices (architecture.md `server/alerts`): the public entry of the folder. */
export * from './types.ts';
export * from './alertOptions.ts';
export * from './noticeRules.ts';
export * from './alertState.ts';
export * from './noticeText.ts';
export * from './noticeOutbox.ts';
export * from './crewNotices.ts';
export * from './noticeChannels.ts';
export * from './channels/noticeChannel.ts';
export * from './channels/logChannel.ts';
export * from './channels/mqttChannel.ts';
export * from './channels/webhookChannel.ts';
export * from './channels/emailChannel.ts';
