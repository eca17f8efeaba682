export * from './check-ins';
export * from './referrals';
