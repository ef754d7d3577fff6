export type * from './brokerConnection.ts';
export * from './embeddedBroker.ts';
export * from './mqttSubscriber.ts';
