export * from './api';
export * from './send-rule';
