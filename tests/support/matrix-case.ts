import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { expect } from 'vitest';
import { currentConsent } from '@shared/rider';
import type { Role } from '@shared/auth';
import type { SaddlestepApp } from '@server/app';
import { Consent, Consultation, Intake } from '@server/models';
import { signedInAs } from './factories';
import { caseOnStepOne, checkInBody } from './care-factories';

/**
 * The case the authorisation matrix tests run against, and every relation a user can have to it:
 * the owner, the assigned fitter, the referred physio (accepted, consented), physios whose
 * referral of the same rider is awaiting consent, had its consent withdrawn, or was declined, an
 * unrelated rider, fitter and physio, and an admin.
 */
export type Who = 'owner' | 'assigned' | 'referred' | 'awaiting' | 'withdrawn' | 'declined' | 'riderX' | 'fitterX' | 'physioX' | 'admin';
export const WHO: Who[] = ['owner', 'assigned', 'referred', 'awaiting', 'withdrawn', 'declined', 'riderX', 'fitterX', 'physioX', 'admin'];
export const ROLE_OF: Record<Who, Role> = { owner: 'rider', riderX: 'rider', assigned: 'fitter', fitterX: 'fitter', referred: 'physio', awaiting: 'physio', withdrawn: 'physio', declined: 'physio', physioX: 'physio', admin: 'admin' };
/** Physios whose referral of this rider gives them no access. They answer like an unrelated physio. */
export const STATE_PHYSIOS = ['awaiting', 'withdrawn', 'declined'] as const;

type Client = Awaited<ReturnType<typeof signedInAs>>;
export type MatrixCase = Awaited<ReturnType<typeof buildMatrixCase>>;

/** A second consultation of the same rider and fitter, so another referral can be open beside the first. */
function extraConsultation(riderId: number, fitterId: number) {
  const startsAt = new Date(Date.now() - 2 * 86_400_000);
  return Consultation.create({ riderId, fitterId, intakeId: null, status: 'plan_active', startsAt, endsAt: new Date(startsAt.getTime() + 3_600_000), holdExpiresAt: null, feeMinor: 9000, currency: 'EUR', calendarUid: `${randomUUID()}@test`, cancelledById: null, cancelReason: null });
}

export async function buildMatrixCase(app: SaddlestepApp['app']) {
  const marker = `marker-${randomUUID().slice(0, 8)}`;
  /** The fitter's private note: only the assigned fitter may ever see it. */
  const note = `private-note-${randomUUID().slice(0, 8)}`;
  const c = await caseOnStepOne(app);
  const clients = { owner: c.rider, assigned: c.fitter, referred: c.physio } as Record<Who, Client>;
  for (const who of ['awaiting', 'withdrawn', 'declined', 'physioX'] as const) clients[who] = await signedInAs(app, 'physio');
  clients.riderX = await signedInAs(app, 'rider');
  clients.fitterX = await signedInAs(app, 'fitter');
  clients.admin = await signedInAs(app, 'admin');
  const ids = { consultation: c.consultation.id, plan: c.planId, bike: c.bikeId, intake: 0, sharedUpload: 0, privateUpload: 0, referral: 0, checkIn: 0, own: {} as Record<Who, number> };
  const intake = (await Intake.findOne({ where: { riderId: c.rider.user.id, status: 'submitted' } }))!;
  await intake.update({ goalNotes: marker });
  ids.intake = intake.id;
  const png = await sharp({ create: { width: 20, height: 20, channels: 3, background: '#123' } }).png().toBuffer();
  for (const key of ['sharedUpload', 'privateUpload'] as const) {
    const res = await c.rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', c.rider.csrfToken).field('view', 'front').attach('file', png, 'p.png');
    ids[key] = res.body.upload.id;
  }
  ids.checkIn = (await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ note: marker })).expect(201)).body.checkIn.id;
  await c.fitter.post(`/api/consultations/${c.consultation.id}/notes`, { body: note }).expect(201);
  const version = currentConsent('share-with-physio')!.version;
  const refer = async (consultationId: number, physio: Client, reason: string) =>
    (await c.fitter.post(`/api/consultations/${consultationId}/referrals`, { urgency: 'routine', reason, attachmentIds: [ids.sharedUpload], physioId: physio.user.id }).expect(201)).body.referral.id as number;
  ids.referral = await refer(c.consultation.id, c.physio, marker);
  await c.rider.post(`/api/rider/referrals/${ids.referral}/consent`, { version, agreed: true }).expect(200);
  await c.physio.post(`/api/physio/referrals/${ids.referral}/accept`).expect(200);
  ids.own.referred = ids.referral;

  for (const who of STATE_PHYSIOS) {
    const other = await extraConsultation(c.rider.user.id, c.fitter.user.id);
    // The declined physio keeps the declined referral in their list, but none of its health details.
    const id = await refer(other.id, clients[who], marker);
    ids.own[who] = id;
    if (who === 'awaiting') continue;
    await c.rider.post(`/api/rider/referrals/${id}/consent`, { version, agreed: true }).expect(200);
    if (who === 'declined') {
      const declined = await clients.declined.post(`/api/physio/referrals/${id}/decline`, { note: 'Outside my practice.' }).expect(200);
      if (JSON.stringify(declined.body).includes(marker)) throw new Error('the decline answer still carries the referral reason');
    } else {
      await clients.withdrawn.post(`/api/physio/referrals/${id}/accept`).expect(200);
      const consent = (await Consent.findOne({ where: { scopeType: 'referral', scopeId: id } }))!;
      await c.rider.post(`/api/rider/consents/${consent.id}/withdraw`).expect(200);
    }
  }
  return { clients, ids, marker, note, caseData: c };
}

/**
 * What `who` must never see in any answer: the case's health data (marker) unless they may read
 * it, the fitter's private note unless they are that fitter, and the unshared photo unless they
 * are the rider or the assigned fitter.
 */
export function forbiddenFor(m: MatrixCase, who: Who): string[] {
  const privatePhoto = `/api/uploads/${m.ids.privateUpload}/`;
  if (who === 'assigned') return [];
  if (who === 'owner') return [m.note];
  if (who === 'referred') return [m.note, privatePhoto];
  return [m.marker, m.note, privatePhoto];
}

/** Fails naming the token when an answer carries something `who` may not see. */
export function expectNoLeak(m: MatrixCase, who: Who, body: unknown) {
  const text = typeof body === 'string' ? body : JSON.stringify(body);
  for (const token of forbiddenFor(m, who)) expect(text, `${who} must not see ${token}`).not.toContain(token);
}
