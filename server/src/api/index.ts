export * from './apiRouter.ts';
export * from './httpError.ts';
export * from './readingsQuery.ts';
export * from './runRoutes.ts';
export * from './liveSocket.ts';
