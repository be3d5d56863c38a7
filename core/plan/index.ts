export * from './svg-sanitize';
export * from './image-type';
