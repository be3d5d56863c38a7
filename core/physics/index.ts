export * from './constants';
export * from './types';
export * from './models';
export * from './estimate';
export * from './sweep';
export * from './student-t';
