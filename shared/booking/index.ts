export * from './availability';
export * from './money';
export * from './refund-policy';
export * from './slots';
export * from './api';
