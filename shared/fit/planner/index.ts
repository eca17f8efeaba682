/** The step planner: caps, schedules, reverts and plan validation. See shared/README.md. */
export * from './build';
export * from './constants';
export * from './instructions';
export * from './limits';
export * from './policy';
export * from './revert';
export * from './schemas';
export * from './validate';
