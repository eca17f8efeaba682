/** Access-log filters ('' / null = any). */
export interface AuditFilter {
  actorId: number | null;
  subjectUserId: number | null;
  action: string;
}

/**
 * The actions the server records (see server/services/*), with plain names for the filter.
 * Any other action can still be typed; the log matches from the start, so `intake` finds every intake action.
 */
export const AUDIT_ACTIONS: { value: string; label: string }[] = [
  { value: 'intake.read', label: 'Intake opened' },
  { value: 'case.read', label: 'Case file opened' },
  { value: 'upload.read', label: 'Photo or clip opened' },
  { value: 'profile.read', label: 'Profile opened' },
  { value: 'plan.read', label: 'Plan opened' },
  { value: 'note.read', label: 'Private notes opened' },
  { value: 'measurement.read', label: 'Photo measurement opened' },
  { value: 'consent.give', label: 'Consent given' },
  { value: 'consent.withdraw', label: 'Consent withdrawn' },
  { value: 'auth.sign_in', label: 'Signed in' },
  { value: 'auth.sign_in_failed', label: 'Sign-in failed' },
  { value: 'user.register', label: 'Account registered' },
  { value: 'payment.succeeded', label: 'Payment received' },
  { value: 'payment.refund', label: 'Refund by the clinic' },
  { value: 'user.update', label: 'Account changed by an admin' },
  { value: 'clinic.settings', label: 'Clinic policy saved' },
  { value: 'account.export', label: 'Rider downloaded their data' },
];

/** A short reading of a browser's user-agent string: the full text stays in the tooltip. */
export function shortAgent(agent: string | null): string {
  if (!agent) return '—';
  const match = /(Firefox|Edg|Chrome|Safari)\/[\d.]+/.exec(agent);
  return match ? match[0].replace('Edg/', 'Edge/') : agent.slice(0, 40);
}
