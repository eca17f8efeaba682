export * from './parameters';
export * from './schemas';
export * from './dates';
export * from './coupling';
