export * from './common';
export * from './domain';
export * from './entities';
export * from './api';
export * from './follow-ups';
export * from './review';
export * from './exchange';
