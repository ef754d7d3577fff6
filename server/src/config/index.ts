export * from './formatIssues.ts';
export * from './runConfig.ts';
export * from './serverConfig.ts';
