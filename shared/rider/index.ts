/** The rider's journey: profile, bikes and setups, intake, consent and uploads (wire schemas). */
export * from './text';
export * from './measure';
export * from './profile';
export * from './bikes';
export * from './consent';
export * from './intake';
export * from './uploads';
