import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { AuditEntry, Consultation, FitterProfile, Payment, Refund, ScheduledJob } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { browserLikeAgent, startTestApp } from '../support/app';
import { buildFitter, calmIntake, isoDateIn, OPEN_WEEK, riderReadyToBook } from '../support/booking-factories';
import { signedInAs, TEST_PASSWORD } from '../support/factories';
import { waitForMails } from '../support/mail';
import { URGENT_FLAG } from '../support/rider-factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

const ALL_DAY = { windows: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '00:00', end: '24:00' })), exceptions: [], slotMinutes: 60, bufferMinutes: 0, minNoticeHours: 0, horizonDays: 30 };

/** A held slot `hoursAhead` from now, on the next whole hour. */
async function holdIn(hoursAhead: number, fitterOptions: Parameters<typeof buildFitter>[0] = {}) {
  const { fitter } = await buildFitter({ availability: ALL_DAY, ...fitterOptions });
  const rider = await riderReadyToBook(saddlestep.app);
  const startsAt = new Date(Math.ceil((Date.now() + hoursAhead * 3_600_000) / 3_600_000) * 3_600_000);
  const res = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: startsAt.toISOString() }).expect(201);
  return { rider, fitter, id: res.body.consultation.id as number, startsAt };
}

describe('the booking gate right before charging', () => {
  it('refuses to charge after an urgent red flag arrives mid-booking, with the stop-riding advice, and frees the slot', async () => {
    const { rider, fitter, id, startsAt } = await holdIn(50);
    await rider.post('/api/rider/intake/submit', { ...calmIntake(), redFlagAnswers: { ...calmIntake().redFlagAnswers, [URGENT_FLAG]: true } }).expect(201);
    const res = await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('urgent_care_first');
    expect(res.body.error.message).toMatch(/stop riding/);
    expect(res.body.error.message).toMatch(/Nothing was charged/);
    expect((await Consultation.findByPk(id))!.status).toBe('cancelled');
    expect(await Payment.count({ where: { consultationId: id, status: 'succeeded' } })).toBe(0);
    const other = await riderReadyToBook(saddlestep.app);
    await other.post('/api/consultations', { fitterId: fitter.id, startsAt: startsAt.toISOString() }).expect(201);
  });
});

describe('fees below the card minimum', () => {
  it('refuses a fitter fee under the currency minimum with a clear message', async () => {
    const fitter = await signedInAs(saddlestep.app, 'fitter');
    const profile = { bio: '', specialties: [], languages: ['English'], feeMinor: 20, currency: 'EUR', timeZone: 'UTC', published: true };
    const res = await fitter.put('/api/fitter/settings', { profile, availability: OPEN_WEEK });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['profile.feeMinor']).toBe('The fee must be at least €0.50: card payments in EUR cannot be smaller.');
    await fitter.put('/api/fitter/settings', { profile: { ...profile, feeMinor: 50 }, availability: OPEN_WEEK }).expect(200);
  });

  it('refuses a clinic default fee under the minimum', async () => {
    const admin = await signedInAs(saddlestep.app, 'admin');
    const current = (await admin.get('/api/admin/settings').expect(200)).body.settings;
    const res = await admin.put('/api/admin/settings', { settings: { ...current, defaultFeeMinor: 0 } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['settings.defaultFeeMinor'] ?? res.body.error.fields.defaultFeeMinor).toMatch(/at least €0.50/);
  });

  it('treats Stripe refusing the amount as final: a clear 422, the hold released, no 502', async () => {
    const { rider, fitter, id } = await holdIn(60);
    // A fee stored before the minimum was checked.
    await FitterProfile.update({ feeMinor: 10 }, { where: { userId: fitter.id } });
    await Consultation.update({ feeMinor: 10 }, { where: { id } });
    const res = await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/refused this payment .*Nothing was charged/);
    expect((await Consultation.findByPk(id))!.status).toBe('cancelled');
    expect((await Payment.findOne({ where: { consultationId: id } }))!.status).toBe('failed');
  });
});

describe('holding a slot: horizon and never-offered times', () => {
  it('refuses a time past the booking horizon, and says so', async () => {
    const { fitter } = await buildFitter({ availability: { ...OPEN_WEEK, horizonDays: 42 } });
    const rider = await riderReadyToBook(saddlestep.app);
    const far = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: `${isoDateIn(120)}T10:00:00.000Z` });
    expect(far.status).toBe(409);
    expect(far.body.error.message).toBe('Sessions can be booked at most 42 days ahead. Please pick one of the times shown.');
    await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: `${isoDateIn(40)}T10:00:00.000Z` }).expect(201);
  });

  it('tells a never-offered time apart from a taken one', async () => {
    const { fitter } = await buildFitter();
    const rider = await riderReadyToBook(saddlestep.app);
    const offGrid = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: `${isoDateIn(10)}T09:30:00.000Z` });
    expect(offGrid.body.error.message).toMatch(/not one this fitter offers/);
    const night = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: `${isoDateIn(10)}T23:00:00.000Z` });
    expect(night.body.error.message).toMatch(/not one this fitter offers/);
    await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: `${isoDateIn(10)}T09:00:00.000Z` }).expect(201);
    const other = await riderReadyToBook(saddlestep.app);
    const taken = await other.post('/api/consultations', { fitterId: fitter.id, startsAt: `${isoDateIn(10)}T09:00:00.000Z` });
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toMatch(/just taken/);
  });
});

describe('POST /api/consultations/:id/no-show', () => {
  it('lets the fitter record a missed session after its start, with no refund, audited and shown to both', async () => {
    const { rider, fitter, id } = await holdIn(3);
    await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
    const fitterClient = await browserLikeAgent(saddlestep.app);
    fitterClient.csrfToken = (await fitterClient.post('/api/auth/sign-in', { email: fitter.email, password: TEST_PASSWORD }).expect(200)).body.csrfToken;
    const early = await fitterClient.post(`/api/consultations/${id}/no-show`, {});
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/start time has passed/);
    await rider.post(`/api/consultations/${id}/no-show`, {}).expect(403);

    const started = new Date(Date.now() - 20 * 60_000);
    await Consultation.update({ startsAt: started, endsAt: new Date(started.getTime() + 3_600_000) }, { where: { id } });
    const res = await fitterClient.post(`/api/consultations/${id}/no-show`, {}).expect(200);
    expect(res.body.consultation.status).toBe('no_show');
    expect(res.body.refund).toMatchObject({ amountMinor: 0 });
    expect((await rider.get(`/api/consultations/${id}`).expect(200)).body.consultation.status).toBe('no_show');
    const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
    expect(await Refund.count({ where: { paymentId: payment.id } })).toBe(0);
    expect(await AuditEntry.count({ where: { action: 'consultation.no_show', subjectId: String(id) } })).toBe(1);
    await fitterClient.post(`/api/consultations/${id}/no-show`, {}).expect(409);
    const terms = await rider.get(`/api/consultations/${id}/cancellation-terms`).expect(200);
    expect(terms.body.policy.summary.join(' ')).toMatch(/no-show\): no refund/);
  });
});

describe('reminders for bookings made less than 24 h ahead', () => {
  it('sends a short reminder 1 h before instead of none', async () => {
    const { rider, id, startsAt } = await holdIn(5);
    await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
    const job = (await ScheduledJob.findOne({ where: { uniqueKey: `booking-reminder:${id}:0` } }))!;
    expect(job.runAt.getTime()).toBe(startsAt.getTime() - 3_600_000);
    await job.update({ runAt: new Date(Date.now() - 1000) });
    await createAppScheduler(saddlestep.ctx).tick();
    const [soon] = await waitForMails(rider.user.email, { subject: /^Starting soon:/ });
    expect(soon).toBeDefined();
  });

  it('sends none when the session starts within the hour (the confirmation is minutes old)', async () => {
    const { rider, id } = await holdIn(0.1);
    await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
    expect(await ScheduledJob.count({ where: { uniqueKey: `booking-reminder:${id}:0` } })).toBe(0);
  });
});
