/** Check-in analysis: trends per region and the next action. */
export * from './analyse';
export * from './compare';
export * from './schemas';
