import { z } from 'zod';
import { ACCOUNT_STATUSES, ROLES } from '../auth/roles';

/** PATCH /api/admin/users/:id — change a role or switch an account off/on. */
export const updateUserSchema = z
  .strictObject({
    role: z.enum(ROLES, { error: 'Choose a role from the list.' }).optional(),
    status: z.enum(['active', 'disabled'] as const satisfies readonly (typeof ACCOUNT_STATUSES)[number][], { error: 'Choose active or disabled.' }).optional(),
  })
  .refine((v) => v.role !== undefined || v.status !== undefined, 'Change the role or the status.');

export const userQuerySchema = z.strictObject({
  role: z.enum(ROLES).optional(),
  status: z.enum(ACCOUNT_STATUSES).optional(),
  q: z.string().trim().max(100).optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
});

export const adminRefundSchema = z.strictObject({
  amountMinor: z.number({ error: 'Enter the amount to refund.' }).int().positive('Refund more than zero.').max(10_000_000),
  reason: z.string().trim().min(1, 'Say why.').max(300, 'Keep the reason under 300 characters.'),
});

export const auditQuerySchema = z.strictObject({
  actorId: z.coerce.number().int().positive().optional(),
  subjectUserId: z.coerce.number().int().positive().optional(),
  action: z.string().trim().max(64).regex(/^[a-z_.]*$/, 'Actions look like intake.read.').optional(),
  /** Rows with a smaller id (for paging back). */
  beforeId: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number({ error: 'The limit is a number.' }).int().min(1, 'Ask for at least 1 row.').max(200, 'Ask for at most 200 rows.').default(50),
});

/** DELETE /api/rider/account — the password again, so a left-open session cannot erase an account. */
export const deleteAccountSchema = z.strictObject({
  password: z.string({ error: 'Enter your password to confirm.' }).min(1, 'Enter your password to confirm.').max(128),
  confirm: z.literal('DELETE', { error: 'Type DELETE to confirm.' }),
});

export * from './refunds';
