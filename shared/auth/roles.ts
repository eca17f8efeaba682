/** The four kinds of account. Riders sign themselves up; fitters and physios wait for an admin. */
export const ROLES = ['rider', 'fitter', 'physio', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** Roles a visitor may choose on the registration form (admins come from the seed or the CLI). */
export const SELF_REGISTER_ROLES = ['rider', 'fitter', 'physio'] as const satisfies readonly Role[];
export type SelfRegisterRole = (typeof SELF_REGISTER_ROLES)[number];

/**
 * Account status. `pending` accounts exist but cannot sign in until an admin approves them;
 * `disabled` accounts were switched off by an admin; `rejected` applications stay for the record.
 */
export const ACCOUNT_STATUSES = ['active', 'pending', 'disabled', 'rejected'] as const;
export type AccountStatus = (typeof ACCOUNT_STATUSES)[number];

/** Roles whose new accounts need an admin's approval before first sign-in. */
export function needsApproval(role: Role): boolean {
  return role === 'fitter' || role === 'physio';
}

/** Plain labels shown in the UI. */
export const ROLE_LABELS: Record<Role, string> = {
  rider: 'Rider',
  fitter: 'Bike fitter',
  physio: 'Physiotherapist',
  admin: 'Clinic admin',
};
