import { z } from 'zod';
import { REFERRAL_STATUSES, REFERRAL_URGENCIES, PHYSIO_DECISIONS } from '@shared/care';
import type { createReferralSchema, declineReferralSchema, physioResponseSchema, clearHoldSchema } from '@shared/care';
import { physioLimitsSchema } from '@shared/fit/planner';
import { consentViewSchema } from '@shared/rider';
import { http } from './http';

/** A referral as fitter, rider and physio see it (the server leaves out what a viewer may not read). */
export const referralSchema = z.object({
  id: z.number(),
  consultationId: z.number(),
  riderId: z.number(),
  riderName: z.string(),
  fitterId: z.number(),
  physio: z.object({ id: z.number(), displayName: z.string() }).nullable(),
  origin: z.enum(['fitter', 'system', 'red-flag']),
  urgency: z.enum(REFERRAL_URGENCIES),
  status: z.enum(REFERRAL_STATUSES),
  statusLabel: z.string(),
  reason: z.string(),
  findings: z.string(),
  attachmentIds: z.array(z.number()),
  decision: z.enum(PHYSIO_DECISIONS).nullable(),
  responseNote: z.string().nullable(),
  limits: physioLimitsSchema.partial().nullable(),
  holdReason: z.string().nullable(),
  /** The physio's reason when they declined. */
  declineNote: z.string().nullable().optional(),
  /** Nobody answered in time and the clinic was told. */
  escalated: z.boolean().optional(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
  acceptedAt: z.string().nullable(),
  closedAt: z.string().nullable(),
  consent: z.object({ given: z.boolean(), withdrawn: z.boolean() }),
});
export type Referral = z.infer<typeof referralSchema>;

const one = z.object({ referral: referralSchema });
const many = z.object({ referrals: z.array(referralSchema) });

export type CreateReferralInput = z.input<typeof createReferralSchema>;
export type DeclineInput = z.input<typeof declineReferralSchema>;
export type PhysioResponseInput = z.input<typeof physioResponseSchema>;
export type ClearHoldInput = z.input<typeof clearHoldSchema>;

/** The fitter's side: referrals of one consultation, referring, confirming a suggestion. */
export const fitterReferralsApi = {
  list: async (consultationId: number) => (await http.get(`/api/consultations/${consultationId}/referrals`, many)).referrals,
  create: async (consultationId: number, input: CreateReferralInput) => (await http.post(`/api/consultations/${consultationId}/referrals`, input, one)).referral,
  confirm: async (referralId: number, input: CreateReferralInput) => (await http.post(`/api/referrals/${referralId}/confirm`, input, one)).referral,
  physios: async () => (await http.get('/api/physios', z.object({ physios: z.array(z.object({ id: z.number(), displayName: z.string() })) }))).physios,
};

/** A consent row; sharing consents may say which referral they belong to. */
const consentSchema = consentViewSchema.extend({ scopeType: z.string().nullable().optional(), scopeId: z.number().nullable().optional() });
export type SharingConsent = z.infer<typeof consentSchema>;

/** The rider's side: their referrals and the agreement to share the case (withdrawable at any time). */
export const riderReferralsApi = {
  list: async () => (await http.get('/api/rider/referrals', many)).referrals,
  consent: async (referralId: number, version: string) => (await http.post(`/api/rider/referrals/${referralId}/consent`, { version, agreed: true }, one)).referral,
  async sharingConsents(): Promise<SharingConsent[]> {
    const all = (await http.get('/api/rider/consents', z.object({ consents: z.array(consentSchema) }))).consents;
    return all.filter((c) => c.kind === 'share-with-physio');
  },
  withdraw: async (consentId: number) => (await http.post(`/api/rider/consents/${consentId}/withdraw`, {}, z.object({ consent: consentSchema }))).consent,
};
