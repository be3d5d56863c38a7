export * from './facts';
export * from './substances';
export * from './templates';
export * from './verdicts';
