export * from './events';
export * from './schemas';
