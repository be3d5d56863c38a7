export * from './distance';
export * from './field';
export * from './format';
