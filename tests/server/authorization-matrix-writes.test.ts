import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { randomUUID } from 'node:crypto';
import type { Response } from 'supertest';
import { currentConsent } from '@shared/rider';
import { buildPlan } from '@shared/fit/planner';
import type { SaddlestepApp } from '@server/app';
import { Consent, Consultation, Referral } from '@server/models';
import { startTestApp } from '../support/app';
import { checkInBody, skipAdaptationDays, today } from '../support/care-factories';
import { TEST_PASSWORD } from '../support/factories';
import { TEST_SETUP } from '../support/plan-factories';
import { bikeBody } from '../support/rider-factories';
import { calmIntake } from '../support/booking-factories';
import { buildMatrixCase, expectNoLeak, WHO, type MatrixCase, type Who } from '../support/matrix-case';

/**
 * Every health-data write, for every relation to the case (tests/support/matrix-case.ts). In each
 * row the users who must be refused go first, so a refused write can be seen to change nothing
 * before the one allowed user's write succeeds; rows that end something (hold, withdrawal,
 * deletion) come last or act on throw-away records. Every answer is checked for leaks.
 */
let saddlestep: SaddlestepApp;
let m: MatrixCase;
const extra = { upload: 0, photo: 0, referral: 0, toDecline: 0, proposal: 0, shareConsent: 0, spare: 0 };

function extraConsultation() {
  const startsAt = new Date(Date.now() - 86_400_000);
  return Consultation.create({ riderId: m.clients.owner.user.id, fitterId: m.clients.assigned.user.id, intakeId: null, status: 'plan_active', startsAt, endsAt: new Date(startsAt.getTime() + 3_600_000), holdExpiresAt: null, feeMinor: 9000, currency: 'EUR', calendarUid: `${randomUUID()}@test`, cancelledById: null, cancelReason: null });
}
async function upload(width: number, height: number, view = 'front') {
  const png = await sharp({ create: { width, height, channels: 3, background: '#456' } }).png().toBuffer();
  return (await m.clients.owner.agent.post('/api/rider/uploads').set('X-CSRF-Token', m.clients.owner.csrfToken).field('view', view).attach('file', png, 'p.png')).body.upload.id as number;
}

beforeAll(async () => {
  saddlestep = await startTestApp();
  m = await buildMatrixCase(saddlestep.app);
  extra.upload = await upload(20, 20);
  extra.photo = await upload(400, 300, 'side-crank-6');
  extra.spare = (await extraConsultation()).id;
  extra.toDecline = (await extraConsultation()).id;
  const proposalOn = await extraConsultation();
  extra.proposal = (await Referral.create({ consultationId: proposalOn.id, riderId: proposalOn.riderId, fitterId: proposalOn.fitterId, physioId: null, origin: 'system', urgency: 'routine', status: 'proposed', reason: m.marker, findings: '', attachmentIds: [], consentId: null, decision: null, responseNote: null, limits: null, holdReason: null, declineNote: null, sentAt: null, receivedAt: null, acceptedAt: null, closedAt: null, escalatedAt: null })).id;
});
afterAll(async () => {
  await saddlestep.close();
});

type Cells = Partial<Record<Who, number>>;
function cells(owner: number, assigned: number, referred: number, riderX: number, fitterX: number, physioX: number, admin: number): Cells {
  return { owner, assigned, referred, riderX, fitterX, physioX, admin, awaiting: physioX, withdrawn: physioX, declined: physioX };
}
const RIDER_ONLY = (riderX: number, owner: number) => cells(owner, 403, 403, riderX, 403, 403, 403);
const FITTER_ONLY = (assigned: number) => cells(403, assigned, 403, 403, 404, 403, 403);
const PHYSIO_ONLY = (referred: number) => cells(403, 403, referred, 403, 403, 404, 403);

/** Refused users first, then the allowed ones; exact status and no leak in every answer. */
async function row(send: (who: Who) => Promise<Response>, expected: Cells) {
  const order = WHO.filter((w) => expected[w] !== undefined).sort((a, b) => Number(expected[a]! < 300) - Number(expected[b]! < 300));
  for (const who of order) {
    const res = await send(who);
    expect(res.status, `${who}: ${JSON.stringify(res.body)}`).toBe(expected[who]);
    expectNoLeak(m, who, res.body);
  }
}
const as = (who: Who) => m.clients[who];
const ids = () => m.ids;
const version = () => currentConsent('share-with-physio')!.version;
const referralBody = (physioId: number) => ({ urgency: 'routine', reason: m.marker, attachmentIds: [], physioId });

describe('health-data writes, by relation to the case', () => {
  it('check-in', () => row((w) => as(w).post(`/api/plans/${ids().plan}/steps/1/check-ins`, checkInBody({ rides: 10 })), RIDER_ONLY(404, 201)));
  it('check-in review', () => row((w) => as(w).post(`/api/check-ins/${ids().checkIn}/review`), FITTER_ONLY(200)));
  it('private note', () => row((w) => as(w).post(`/api/consultations/${ids().consultation}/notes`, { body: 'Reviewed.' }), FITTER_ONLY(201)));
  it('photo measurement', () => {
    const points = { hip: { x: 100, y: 50 }, knee: { x: 200, y: 130 }, ankle: { x: 180, y: 260 }, kneeFront: { x: 215, y: 130 }, spindle: { x: 200, y: 280 } };
    return row((w) => as(w).post(`/api/uploads/${extra.photo}/measurements`, { consultationId: ids().consultation, input: { points, clickPrecisionPx: 3, facing: 'right' } }), FITTER_ONLY(201));
  });
  it('create a referral', async () => {
    await row((w) => as(w).post(`/api/consultations/${extra.spare}/referrals`, referralBody(as('referred').user.id)), FITTER_ONLY(201));
    extra.referral = (await Referral.findOne({ where: { consultationId: extra.spare } }))!.id;
  });
  it('confirm a proposal', () => row((w) => as(w).post(`/api/referrals/${extra.proposal}/confirm`, referralBody(as('referred').user.id)), FITTER_ONLY(200)));
  it('consent to a referral', async () => {
    await row((w) => as(w).post(`/api/rider/referrals/${extra.referral}/consent`, { version: version(), agreed: true }), RIDER_ONLY(404, 200));
    extra.shareConsent = (await Consent.findOne({ where: { scopeType: 'referral', scopeId: extra.referral } }))!.id;
  });
  for (const action of ['receive', 'accept', 'start'] as const) {
    it(`physio ${action}`, () => row((w) => as(w).post(`/api/physio/referrals/${extra.referral}/${action}`), PHYSIO_ONLY(200)));
  }
  it('physio decline', async () => {
    const id = (await as('assigned').post(`/api/consultations/${extra.toDecline}/referrals`, referralBody(as('referred').user.id)).expect(201)).body.referral.id;
    await as('owner').post(`/api/rider/referrals/${id}/consent`, { version: version(), agreed: true }).expect(200);
    await row((w) => as(w).post(`/api/physio/referrals/${id}/decline`, { note: 'Not for me.' }), PHYSIO_ONLY(200));
  });
  it('physio respond (hold, pausing the live plan) and clear the hold', async () => {
    await row((w) => as(w).post(`/api/physio/referrals/${extra.referral}/respond`, { note: 'Assess first.', decision: 'hold', holdReason: 'Knee assessment first.' }), PHYSIO_ONLY(200));
    await row((w) => as(w).post(`/api/physio/referrals/${extra.referral}/clear-hold`, { note: 'Assessed.' }), PHYSIO_ONLY(200));
  });
  it('apply a step', async () => {
    await skipAdaptationDays(ids().plan, 2);
    await row((w) => as(w).post(`/api/plans/${ids().plan}/steps/2/apply`, { appliedOn: today() }), RIDER_ONLY(404, 200));
  });
  it('undo a step', () => row((w) => as(w).post(`/api/plans/${ids().plan}/steps/2/revert`, {}), RIDER_ONLY(404, 201)));
  it('withdraw a share consent', () => row((w) => as(w).post(`/api/rider/consents/${extra.shareConsent}/withdraw`), RIDER_ONLY(404, 200)));
  it('delete an upload', () => row((w) => as(w).delete(`/api/rider/uploads/${extra.upload}`), RIDER_ONLY(404, 204)));
  it('send a plan', async () => {
    const inputs = (await as('assigned').get(`/api/consultations/${ids().consultation}/plan-inputs?bikeId=${ids().bike}`).expect(200)).body;
    const { bikeId: _b, physio, ...rest } = inputs;
    const target = { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 2 };
    const plan = buildPlan({ ...rest, ...(physio ? { physio } : {}), target });
    await row((w) => as(w).post(`/api/consultations/${ids().consultation}/plans`, { bikeId: ids().bike, target, startDate: inputs.startDate, plan }), FITTER_ONLY(201));
  });
  it('own-data writes: intake draft, uploads, bikes and setups only for the rider who owns them', async () => {
    await row((w) => as(w).put('/api/rider/intake/draft', { symptoms: [] }), { ...RIDER_ONLY(200, 200) });
    await row((w) => as(w).patch(`/api/rider/bikes/${ids().bike}`, { name: 'Renamed' }), RIDER_ONLY(404, 200));
    await row((w) => as(w).post(`/api/rider/bikes/${ids().bike}/snapshots`, { unit: 'mm', setup: TEST_SETUP, cleatNotes: '', takenOn: today() }), RIDER_ONLY(404, 201));
  });
  it('start a session', async () => {
    const booked = await extraConsultation();
    await booked.update({ status: 'booked' });
    await row((w) => as(w).post(`/api/consultations/${booked.id}/start`), FITTER_ONLY(200));
  });
  it('own-data: bike read and retire, intake submit and photo upload only for the rider who owns them', async () => {
    await row((w) => as(w).get(`/api/rider/bikes/${ids().bike}`), RIDER_ONLY(404, 200));
    const spareBike = (await as('owner').post('/api/rider/bikes', bikeBody()).expect(201)).body.bike.id as number;
    await row((w) => as(w).delete(`/api/rider/bikes/${spareBike}`), RIDER_ONLY(404, 204));
    // Each rider submits their own intake (the case's own rider last, so refusals come first).
    await row((w) => as(w).post('/api/rider/intake/submit', calmIntake()), RIDER_ONLY(201, 201));
    const png = await sharp({ create: { width: 30, height: 20, channels: 3, background: '#654' } }).png().toBuffer();
    await row((w) => as(w).agent.post('/api/rider/uploads').set('X-CSRF-Token', as(w).csrfToken).field('view', 'front').attach('file', png, 'front.png'), RIDER_ONLY(201, 201));
  });
  it('delete the account: staff refused; the rider’s own, last', () =>
    row((w) => as(w).agent.delete('/api/rider/account').set('X-CSRF-Token', as(w).csrfToken).send({ password: TEST_PASSWORD, confirm: 'DELETE' }), { ...cells(204, 403, 403, 403, 403, 403, 403), riderX: undefined }));
});
