import { z } from 'zod';
import { publicUserSchema, ROLES, type AccountDecision, type PublicUser, type Role } from '@shared/auth';
import { attentionRefundListSchema, refundRetryResultSchema, type RefundRetryResult } from '@shared/admin';
import { clinicSettingsSchema, type ClinicSettings, type ClinicSettingsInput } from '@shared/clinic';
import { SETUP_PARAMETERS } from '@shared/fit/setup';
import { http } from './http';

const adminHomeSchema = z.object({
  greetingName: z.string(),
  pendingAccounts: z.array(publicUserSchema),
  // SQL counts can arrive as strings from some drivers; coerce rather than fail the page.
  accountsByRole: z.partialRecord(z.enum(ROLES), z.coerce.number()),
});
export type AdminHome = z.infer<typeof adminHomeSchema>;

const decisionResult = z.object({ account: publicUserSchema });

const count = z.coerce.number().int().min(0);
const pageOf = { total: count, page: count, pageSize: count };

const userPageSchema = z.object({ users: z.array(publicUserSchema), ...pageOf });
export type UserPage = z.infer<typeof userPageSchema>;
export interface UserQuery {
  role?: Role | undefined;
  status?: PublicUser['status'] | undefined;
  q?: string | undefined;
  page?: number | undefined;
}
export type UserChange = { role?: Role; status?: 'active' | 'disabled' };

const range = z.tuple([z.number(), z.number()]);
const capRanges = z.record(z.enum(SETUP_PARAMETERS), range);
const hardBoundsSchema = z.object({
  stepCaps: capRanges,
  windowCaps: capRanges,
  windowDays: range,
  adaptationDays: range,
  adaptationRides: range,
  revertRecencyDays: range,
});
export type HardBounds = z.infer<typeof hardBoundsSchema>;
const settingsPageSchema = z.object({ settings: clinicSettingsSchema, hardBounds: hardBoundsSchema });
export type SettingsPage = z.infer<typeof settingsPageSchema>;

const adminPaymentSchema = z.object({
  id: z.coerce.number().int(),
  consultationId: z.coerce.number().int().nullable(),
  riderName: z.string(),
  fitterName: z.string().nullable(),
  amountMinor: count,
  refundedMinor: count,
  currency: z.string(),
  status: z.string(),
  createdAt: z.string(),
  stripeChargeId: z.string().nullable(),
});
export type AdminPayment = z.infer<typeof adminPaymentSchema>;
const refundedPaymentSchema = adminPaymentSchema.pick({ id: true, status: true, amountMinor: true, refundedMinor: true, currency: true });
export type RefundedPayment = z.infer<typeof refundedPaymentSchema>;
const paymentPageSchema = z.object({ payments: z.array(adminPaymentSchema), ...pageOf });
export type PaymentPage = z.infer<typeof paymentPageSchema>;

const auditEntrySchema = z.object({
  // BIGINT ids may come back as strings from the driver.
  id: z.coerce.number().int(),
  createdAt: z.string(),
  actorId: z.coerce.number().int().nullable(),
  actorName: z.string().nullable(),
  actorRole: z.string().nullable(),
  action: z.string(),
  subjectType: z.string().nullable(),
  subjectId: z.union([z.string(), z.number()]).nullable(),
  subjectUserId: z.coerce.number().int().nullable(),
  subjectUserName: z.string().nullable(),
  ip: z.string().nullable(),
  userAgent: z.string().nullable(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;
const auditPageSchema = z.object({ entries: z.array(auditEntrySchema), nextBeforeId: z.coerce.number().int().nullable() });
export type AuditPage = z.infer<typeof auditPageSchema>;
export interface AuditQuery {
  actorId?: number | undefined;
  subjectUserId?: number | undefined;
  action?: string | undefined;
  beforeId?: number | undefined;
  limit?: number | undefined;
}

/** `?a=1&b=x` from the set values only, so an empty filter is simply left out. */
function query(params: Record<string, string | number | undefined>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `?${text}` : '';
}

/** The Clinic screen: approvals, people, policy, payments and the access log. */
export const adminApi = {
  home: () => http.get('/api/admin/home', adminHomeSchema),
  async decideAccount(id: number, decision: AccountDecision['decision']): Promise<PublicUser> {
    const { account } = await http.post(`/api/admin/accounts/${id}/decision`, { decision }, decisionResult);
    return account;
  },

  users: (q: UserQuery) => http.get(`/api/admin/users${query({ role: q.role, status: q.status, q: q.q?.trim(), page: q.page })}`, userPageSchema),
  async updateUser(id: number, change: UserChange): Promise<PublicUser> {
    return (await http.patch(`/api/admin/users/${id}`, change, z.object({ user: publicUserSchema }))).user;
  },

  settings: () => http.get('/api/admin/settings', settingsPageSchema),
  async saveSettings(settings: ClinicSettingsInput): Promise<ClinicSettings> {
    return (await http.put('/api/admin/settings', { settings }, z.object({ settings: clinicSettingsSchema }))).settings;
  },

  payments: (page: number) => http.get(`/api/admin/payments${query({ page })}`, paymentPageSchema),
  /**
   * Answers with the payment's new totals and status; the caller keeps the names it already shows.
   * `idempotencyKey` is one UUID per attempt, reused for a retry, so a refund is made once.
   * `pending`: recorded, but Stripe has not taken it yet (the server keeps trying).
   */
  async refund(id: number, body: { amountMinor: number; reason: string; idempotencyKey: string }): Promise<{ payment: RefundedPayment; pending: boolean }> {
    const answer = await http.post(`/api/admin/payments/${id}/refund`, body, z.object({ payment: refundedPaymentSchema, refund: z.object({ status: z.string() }).optional() }));
    return { payment: answer.payment, pending: answer.refund?.status === 'pending' };
  },

  /** Refunds Stripe refused, or that no retry is sending any more ("Refunds that need you"). */
  refundsNeedingAttention: () => http.get('/api/admin/refunds/attention', attentionRefundListSchema),
  /**
   * Try a stuck refund again. `attemptKey` is one UUID per press, reused after a lost answer, so the
   * refund is re-queued once. Answers with the refund's state after the immediate try.
   */
  async retryRefund(id: number, attemptKey: string): Promise<RefundRetryResult['refund']> {
    return (await http.post(`/api/admin/refunds/${id}/retry`, { attemptKey }, refundRetryResultSchema)).refund;
  },

  audit: (q: AuditQuery) => http.get(`/api/admin/audit${query({ ...q })}`, auditPageSchema),
};
