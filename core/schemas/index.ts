export * from './common';
export * from './domain';
export * from './entities';
export * from './api';
