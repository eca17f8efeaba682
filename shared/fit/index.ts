/**
 * The fit computation, shared by client and server. Import per area (e.g. `@shared/fit/planner`)
 * or from here; each area's index lists its public API by name, so this re-exports only that.
 */
export * from './errors';
export * from './setup';
export * from './saddle-height';
export * from './photo';
export * from './planner';
export * from './triage';
export * from './checkin';
