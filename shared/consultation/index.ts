export * from './states';
export * from './session-start';
