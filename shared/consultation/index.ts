export * from './states';
