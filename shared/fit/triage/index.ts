/** Triage: body regions, possible fit causes, red-flag screening and cautions. */
export * from './cautions';
export * from './causes';
export * from './red-flags';
export * from './regions';
export * from './schemas';
