export * from './roles';
export * from './schemas';
export * from './time-zones';
