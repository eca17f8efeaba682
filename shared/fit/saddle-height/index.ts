/** Saddle-height estimates, the knee-angle leg model and corrections. See shared/README.md. */
export * from './constants';
export * from './corrections';
export * from './estimates';
export * from './leg-model';
export * from './schemas';
