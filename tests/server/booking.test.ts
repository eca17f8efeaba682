import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { DateTime } from 'luxon';
import { Consultation, ConsultationEvent, Payment } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { buildFitter, isoDateIn, riderReadyToBook } from '../support/booking-factories';
import { signedInAs } from '../support/factories';
import { waitForMails } from '../support/mail';
import { closedPortUrl, withStripeAt } from '../support/stripe-outage';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

type Client = Awaited<ReturnType<typeof riderReadyToBook>>;

async function firstSlot(rider: Client, fitterId: number, daysAhead = 10): Promise<string> {
  const res = await rider.get(`/api/fitters/${fitterId}/slots?from=${isoDateIn(daysAhead)}&to=${isoDateIn(daysAhead)}`).expect(200);
  return res.body.slots[0].start as string;
}

describe('GET /api/fitters/:id/slots', () => {
  it('lists a published fitter and their slots as UTC instants', async () => {
    const { fitter } = await buildFitter({ timeZone: 'Europe/Oslo' });
    const rider = await riderReadyToBook(saddlestep.app);
    const list = await rider.get('/api/fitters').expect(200);
    expect(list.body.fitters.map((f: { id: number }) => f.id)).toContain(fitter.id);
    const res = await rider.get(`/api/fitters/${fitter.id}/slots?from=${isoDateIn(5)}&to=${isoDateIn(5)}`).expect(200);
    expect(res.body.slots).toHaveLength(16);
    expect(res.body.slots[0].start).toMatch(/Z$/);
  });

  it('keeps the fitter’s 09:00 at 09:00 local across the next Europe/Berlin clock change', async () => {
    // Find the next day on which Berlin's UTC offset changes (within a year, always).
    let day = DateTime.now().setZone('Europe/Berlin').startOf('day').plus({ days: 2 });
    while (day.plus({ days: 1 }).set({ hour: 12 }).offset === day.set({ hour: 12 }).offset) day = day.plus({ days: 1 });
    const [before, change, after] = [day, day.plus({ days: 1 }), day.plus({ days: 2 })];
    const { fitter } = await buildFitter({
      timeZone: 'Europe/Berlin',
      availability: { windows: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '09:00', end: '10:00' })), exceptions: [], slotMinutes: 60, bufferMinutes: 0, minNoticeHours: 0, horizonDays: 366 },
    });
    const rider = await riderReadyToBook(saddlestep.app);
    const res = await rider.get(`/api/fitters/${fitter.id}/slots?from=${before.toISODate()}&to=${after.toISODate()}`).expect(200);
    const expected = [before, change, after].map((d) => d.set({ hour: 9 }).toUTC().toISO());
    expect(res.body.slots.map((s: { start: string }) => s.start)).toEqual(expected);
    // The UTC times differ by an hour across the change, while the local time stays 09:00.
    expect(new Set(expected.map((iso) => iso!.slice(11, 13))).size).toBe(2);
  });

  it('answers bad ranges with 400 and unknown fitters with 404', async () => {
    const rider = await riderReadyToBook(saddlestep.app);
    const { fitter } = await buildFitter();
    const bad = await rider.get(`/api/fitters/${fitter.id}/slots?from=2027-13-01&to=x`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.from).toBe('That date does not exist.');
    await rider.get(`/api/fitters/999999999/slots?from=${isoDateIn(1)}&to=${isoDateIn(2)}`).expect(404);
    await rider.get(`/api/fitters/abc/slots?from=${isoDateIn(1)}&to=${isoDateIn(2)}`).expect(404);
  });
});

describe('POST /api/consultations (holding a slot)', () => {
  it('lets exactly one of 20 concurrent requests take a slot; the others get 409', async () => {
    const { fitter } = await buildFitter();
    const riders = await Promise.all(Array.from({ length: 20 }, () => riderReadyToBook(saddlestep.app)));
    const startsAt = await firstSlot(riders[0]!, fitter.id);
    const results = await Promise.all(riders.map((r) => r.post('/api/consultations', { fitterId: fitter.id, startsAt })));
    const statuses = results.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(19);
    expect(results.find((r) => r.status === 409)!.body.error.message).toMatch(/just taken/);
    expect(await Consultation.count({ where: { fitterId: fitter.id } })).toBe(1);
  });

  it('refuses a time that is not an offered slot, a past time, and a time inside the notice', async () => {
    const { fitter } = await buildFitter({ availability: { windows: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '06:00', end: '22:00' })), exceptions: [], slotMinutes: 60, bufferMinutes: 0, minNoticeHours: 48 } });
    const rider = await riderReadyToBook(saddlestep.app);
    const offGrid = `${isoDateIn(10)}T09:30:00.000Z`;
    await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: offGrid }).expect(409);
    await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: '2020-01-01T09:00:00.000Z' }).expect(409);
    await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: `${isoDateIn(1)}T12:00:00.000Z` }).expect(409);
  });

  it('releases a hold when it runs out: the slot is offered again and the old hold cannot be paid', async () => {
    const { fitter } = await buildFitter();
    const first = await riderReadyToBook(saddlestep.app);
    const second = await riderReadyToBook(saddlestep.app);
    const startsAt = await firstSlot(first, fitter.id);
    const held = await first.post('/api/consultations', { fitterId: fitter.id, startsAt }).expect(201);
    expect(await firstSlot(second, fitter.id)).not.toBe(startsAt);

    await Consultation.update({ holdExpiresAt: new Date(Date.now() - 1000) }, { where: { id: held.body.consultation.id } });
    expect(await firstSlot(second, fitter.id)).toBe(startsAt);
    const late = await first.post(`/api/consultations/${held.body.consultation.id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() });
    expect(late.status).toBe(409);
    expect(late.body.error.message).toMatch(/ran out/);
    await second.post('/api/consultations', { fitterId: fitter.id, startsAt }).expect(201);
  });

  it('refuses bad input with 400 and writes nothing', async () => {
    const rider = await riderReadyToBook(saddlestep.app);
    // Only this rider's bookings: other test files create their own at the same time.
    const before = await Consultation.count({ where: { riderId: rider.user.id } });
    for (const body of [{}, { fitterId: 'x', startsAt: 'tomorrow' }, { fitterId: 1, startsAt: '2027-01-01T09:00:00Z', extra: 1 }, { fitterId: -3, startsAt: "'; DROP TABLE consultations; --" }]) {
      const res = await rider.post('/api/consultations', body);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toEqual(expect.any(String));
    }
    expect(await Consultation.count({ where: { riderId: rider.user.id } })).toBe(before);
  });

  it('is for riders only', async () => {
    const fitter = await signedInAs(saddlestep.app, 'fitter');
    await fitter.post('/api/consultations', { fitterId: fitter.user.id, startsAt: new Date().toISOString() }).expect(403);
  });
});

describe('POST /api/consultations/:id/payment', () => {
  async function held() {
    const { fitter } = await buildFitter();
    const rider = await riderReadyToBook(saddlestep.app);
    const startsAt = await firstSlot(rider, fitter.id);
    const res = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt }).expect(201);
    return { rider, fitter, startsAt, id: res.body.consultation.id as number };
  }

  it('books the consultation after a successful charge', async () => {
    const { rider, id } = await held();
    const res = await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() });
    expect(res.status).toBe(200);
    expect(res.body.consultation).toMatchObject({ status: 'booked', payment: { status: 'succeeded', amountMinor: 9000, currency: 'EUR' } });
  });

  it('shows a clear message for a declined card and releases the hold', async () => {
    const { rider, fitter, startsAt, id } = await held();
    const res = await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_chargeDeclined', attemptKey: randomUUID() });
    expect(res.status).toBe(402);
    expect(res.body.error.message).toMatch(/declined/);
    expect((await Consultation.findByPk(id))!.status).toBe('cancelled');
    const other = await riderReadyToBook(saddlestep.app);
    await other.post('/api/consultations', { fitterId: fitter.id, startsAt }).expect(201);
  });

  it('keeps the hold and the attempt retryable when the payment service is unavailable', async () => {
    const { rider, id } = await held();
    const attemptKey = randomUUID();
    // The real Stripe client pointed at a port where nothing listens: a real outage.
    const [first, retry] = await withStripeAt(saddlestep.ctx, await closedPortUrl(), async () => [
      await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey }),
      await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey }),
    ]);
    expect(first!.status).toBe(502);
    expect(first!.body.error.message).toMatch(/try again/);
    expect(retry!.status).toBe(502);
    expect((await Consultation.findByPk(id))!.status).toBe('awaiting_payment');
    expect(await Payment.count({ where: { consultationId: id } })).toBe(1);
  });

  it('charges once for a retried or double-clicked payment with the same attempt key', async () => {
    const { rider, id } = await held();
    const attemptKey = randomUUID();
    const [a, b] = await Promise.all([
      rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey }),
      rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey }),
    ]);
    const retry = await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey });
    expect([a.status, b.status, retry.status].filter((s) => s === 200).length).toBeGreaterThanOrEqual(2);
    expect(retry.status).toBe(200);
    const payments = await Payment.findAll({ where: { consultationId: id } });
    expect(payments).toHaveLength(1);
    expect(payments[0]!.status).toBe('succeeded');
    // The success step ran once: one charge at Stripe, one confirmation, one receipt.
    // Every charge the Stripe fake holds (it records no customer on charges, so none can be filtered by it).
    let charges = 0;
    for await (const charge of saddlestep.ctx.stripe!.charges.list({ limit: 100 })) if (charge.metadata?.consultationId === String(id)) charges += 1;
    expect(charges).toBe(1);
    expect(await waitForMails(rider.user.email, { subject: /^Booked:/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    expect(await waitForMails(rider.user.email, { subject: /^Receipt:/, count: 2, timeoutMs: 500 })).toHaveLength(1);
    expect(await ConsultationEvent.count({ where: { consultationId: id, toStatus: 'booked' } })).toBe(1);
  });

  it('refuses a second payment with a new key once paid', async () => {
    const { rider, id } = await held();
    await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
    const again = await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() });
    expect(again.status).toBe(409);
    expect(await Payment.count({ where: { consultationId: id, status: 'succeeded' } })).toBe(1);
  });

  it('charges zero-decimal currencies in whole units', async () => {
    const { fitter } = await buildFitter({ feeMinor: 12000, currency: 'JPY' });
    const rider = await riderReadyToBook(saddlestep.app);
    const startsAt = await firstSlot(rider, fitter.id);
    const res = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt }).expect(201);
    const paid = await rider.post(`/api/consultations/${res.body.consultation.id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
    expect(paid.body.consultation.payment).toMatchObject({ amountMinor: 12000, currency: 'JPY' });
  });

  it('answers 404 for someone else’s booking and 400 for a bad token', async () => {
    const { id } = await held();
    const stranger = await riderReadyToBook(saddlestep.app);
    await stranger.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(404);
    const bad = await stranger.post(`/api/consultations/${id}/payment`, { token: '<script>', attemptKey: 'nope' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(expect.arrayContaining(['token', 'attemptKey']));
  });
});
