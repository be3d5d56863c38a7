export * from './metrics';
export * from './evaluate';
