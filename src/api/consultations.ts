import { z } from 'zod';
import { CONSULTATION_STATES } from '@shared/consultation';
import { cardEntrySchema, type CardEntry } from '@shared/booking';
import { http } from './http';

const partySchema = z.object({ id: z.number(), displayName: z.string(), timeZone: z.string() });

const consultationSchema = z.object({
  id: z.number(),
  status: z.enum(CONSULTATION_STATES),
  statusLabel: z.string(),
  startsAt: z.string(),
  endsAt: z.string(),
  holdExpiresAt: z.string().nullable(),
  feeMinor: z.number(),
  currency: z.string(),
  flaggedForPhysio: z.boolean(),
  rider: partySchema.nullable(),
  fitter: partySchema.nullable(),
  payment: z
    .object({ status: z.string(), amountMinor: z.number(), refundedMinor: z.number(), currency: z.string() })
    .nullable(),
});
export type ConsultationView = z.infer<typeof consultationSchema>;

const envelope = z.object({ consultation: consultationSchema });

const termsSchema = z.object({ amountMinor: z.number(), share: z.number(), reason: z.string(), mayReschedule: z.boolean() });
export type CancellationTerms = z.infer<typeof termsSchema>;

/** The studio's refund rules, with the server's own sentences for them (shown before paying). */
const policySchema = z.object({ windowHours: z.number(), earlyRefundShare: z.number(), lateRefundShare: z.number(), noShowRefundShare: z.number(), summary: z.array(z.string()) });
export type RefundPolicyView = z.infer<typeof policySchema>;

/**
 * Whether the rider may book now. Read leniently: the intake feature owns this endpoint, and only
 * `ready`, `reason` and `level` matter to the booking page.
 */
const readinessSchema = z.object({
  ready: z.boolean(),
  code: z.string().optional(),
  reason: z.string().optional(),
  level: z.enum(['none', 'physio-routine', 'physio-soon', 'urgent']).nullish(),
  intakeId: z.number().optional(),
  flaggedForPhysio: z.boolean().optional(),
});
export type BookingReadiness = z.infer<typeof readinessSchema>;

export type TestCard = Extract<CardEntry, { method: 'test_cards' }>['cards'][number];

export const consultationsApi = {
  readiness: () => http.get('/api/rider/booking-readiness', readinessSchema),

  async list(): Promise<ConsultationView[]> {
    const { consultations } = await http.get('/api/consultations', z.object({ consultations: z.array(consultationSchema) }));
    return consultations;
  },
  async show(id: number): Promise<ConsultationView> {
    return (await http.get(`/api/consultations/${id}`, envelope)).consultation;
  },
  /** Holds the slot for the rider while they pay; 409 when someone else was quicker. */
  async hold(fitterId: number, startsAt: string): Promise<ConsultationView> {
    return (await http.post('/api/consultations', { fitterId, startsAt }, envelope)).consultation;
  },
  /** The same `attemptKey` for a retried attempt, so the card is charged at most once. */
  async pay(id: number, token: string, attemptKey: string): Promise<ConsultationView> {
    return (await http.post(`/api/consultations/${id}/payment`, { token, attemptKey }, envelope)).consultation;
  },
  async reschedule(id: number, startsAt: string): Promise<ConsultationView> {
    return (await http.post(`/api/consultations/${id}/reschedule`, { startsAt }, envelope)).consultation;
  },
  async cancellationTerms(id: number): Promise<CancellationTerms | null> {
    return (await http.get(`/api/consultations/${id}/cancellation-terms`, z.object({ terms: termsSchema.nullable() }))).terms;
  },
  async refundPolicy(id: number): Promise<RefundPolicyView> {
    return (await http.get(`/api/consultations/${id}/cancellation-terms`, z.object({ policy: policySchema }))).policy;
  },
  /** `refundPendingMinor`: promised but not yet taken by Stripe (the server retries it). */
  cancel(id: number, reason?: string) {
    const body = reason ? { reason } : {};
    return http.post(
      `/api/consultations/${id}/cancel`,
      body,
      z.object({ consultation: consultationSchema, refundedMinor: z.number(), refundPendingMinor: z.number().optional(), terms: termsSchema.nullable().optional() }),
    );
  },
  /** The fitter records that the rider did not come; only after the start time. */
  async noShow(id: number): Promise<ConsultationView> {
    return (await http.post(`/api/consultations/${id}/no-show`, {}, envelope)).consultation;
  },
  /** How this server takes cards: Stripe's card field, the development test cards, or not at all. */
  cardEntry: () => http.get('/api/payments/card-entry', cardEntrySchema),
};
