import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { Consultation, Payment, Refund, ScheduledJob } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { reconcilePendingPayments } from '@server/services/payment-reconcile';
import { startTestApp } from '../support/app';
import { buildFitter, isoDateIn, riderReadyToBook } from '../support/booking-factories';
import { signedInAs } from '../support/factories';
import { waitForMails } from '../support/mail';
import { chargeAnswerLosingProxy, closedPortUrl, withStripeAt } from '../support/stripe-outage';

let saddlestep: SaddlestepApp;
/** A port where nothing listens (an outage), and a proxy that loses the answers to charges. */
let closedPort: string;
let proxy: Awaited<ReturnType<typeof chargeAnswerLosingProxy>>;

beforeAll(async () => {
  saddlestep = await startTestApp();
  closedPort = await closedPortUrl();
  proxy = await chargeAnswerLosingProxy();
});
afterAll(async () => {
  await saddlestep.close();
  await proxy.close();
});

const duringOutage = <T>(work: () => Promise<T>) => withStripeAt(saddlestep.ctx, closedPort, work);
const losingChargeAnswers = <T>(work: () => Promise<T>) => withStripeAt(saddlestep.ctx, proxy.url, work);

async function held(daysAhead = 11) {
  const { fitter } = await buildFitter();
  const rider = await riderReadyToBook(saddlestep.app);
  const slots = await rider.get(`/api/fitters/${fitter.id}/slots?from=${isoDateIn(daysAhead)}&to=${isoDateIn(daysAhead)}`).expect(200);
  const res = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: slots.body.slots[0].start }).expect(201);
  return { rider, fitter, id: res.body.consultation.id as number };
}

async function paid() {
  const booking = await held();
  await booking.rider.post(`/api/consultations/${booking.id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
  const payment = (await Payment.findOne({ where: { consultationId: booking.id } }))!;
  return { ...booking, payment };
}

/** Wait for work that runs after a commit (e.g. the refund a webhook starts). */
async function eventually(check: () => Promise<boolean>, timeoutMs = 5000) {
  const deadline = Date.now() + timeoutMs;
  while (!(await check()) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
}

/** Make an attempt look older than the reconciler's patience. */
async function age(paymentId: number, minutes = 6) {
  await saddlestep.sequelize.query('UPDATE payments SET updated_at = ? WHERE id = ?', { replacements: [new Date(Date.now() - minutes * 60_000), paymentId] });
}

/** Charges Stripe holds for this attempt (the fake records no customer on charges, so all are listed). */
async function chargesFor(payment: Payment) {
  const found = [];
  for await (const charge of saddlestep.ctx.stripe!.charges.list({ limit: 100 })) if (charge.metadata?.paymentId === String(payment.id)) found.push(charge);
  return found;
}

function signedEvent(type: string, object: object) {
  const payload = JSON.stringify({ id: `evt_${randomUUID().replace(/-/g, '')}`, object: 'event', type, data: { object } });
  const header = saddlestep.ctx.stripe!.webhooks.generateTestHeaderString({ payload, secret: process.env.STRIPE_WEBHOOK_SECRET! });
  return request(saddlestep.app).post('/api/stripe/webhook').set('Content-Type', 'application/json').set('Stripe-Signature', header).send(payload);
}

describe('a charge whose answer was lost', () => {
  it('is booked once by the charge.succeeded webhook, with one receipt, and a late retry answers 200', async () => {
    const { rider, id } = await held();
    const attemptKey = randomUUID();
    const lost = await losingChargeAnswers(() => rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey }));
    expect(lost.status).toBe(502);
    const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
    expect(payment.status).toBe('pending');
    const [charge] = await chargesFor(payment);
    expect(charge).toBeDefined();

    await signedEvent('charge.succeeded', charge!).expect(200);
    expect((await Consultation.findByPk(id))!.status).toBe('booked');
    await payment.reload();
    expect(payment).toMatchObject({ status: 'succeeded', stripeChargeId: charge!.id });
    // The rider's retry (same key) reaches the same charge and finds the booking made.
    await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey }).expect(200);
    await signedEvent('charge.succeeded', charge!).expect(200);
    expect(await waitForMails(rider.user.email, { subject: /^Booked:/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
    expect(await waitForMails(rider.user.email, { subject: /^Receipt:/, count: 2, timeoutMs: 500 })).toHaveLength(1);
    expect(await chargesFor(payment)).toHaveLength(1);
  });

  it('is found by the reconciler when no webhook comes, and the booking is made', async () => {
    const { rider, id } = await held();
    await losingChargeAnswers(() => rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(502));
    const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
    await age(payment.id);
    await reconcilePendingPayments(saddlestep.ctx);
    expect((await Consultation.findByPk(id))!.status).toBe('booked');
    expect((await payment.reload()).status).toBe('succeeded');
    expect(await waitForMails(rider.user.email, { subject: /^Booked:/ })).toHaveLength(1);
  });

  it('releases an attempt that never reached Stripe once the reconciler has asked', async () => {
    const { rider, id } = await held();
    await duringOutage(() => rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(502));
    const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
    await age(payment.id);
    await reconcilePendingPayments(saddlestep.ctx);
    expect((await payment.reload()).status).toBe('failed');
    // The hold had time left, so the rider may pay again with a new attempt.
    expect((await Consultation.findByPk(id))!.status).toBe('requested');
    await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
  });

  it('refunds a charge that arrives after the booking was released', async () => {
    const { rider, id } = await held();
    await losingChargeAnswers(() => rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(502));
    const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
    await rider.post(`/api/consultations/${id}/cancel`, {}).expect(200);
    const [charge] = await chargesFor(payment);
    await signedEvent('charge.succeeded', charge!).expect(200);
    await eventually(async () => (await payment.reload()).status === 'refunded');
    expect(payment).toMatchObject({ status: 'refunded', refundedMinor: 9000 });
    expect(await waitForMails(rider.user.email, { subject: /^Refund:/ })).toHaveLength(1);
  });

  it('releases the hold on charge.failed', async () => {
    const { rider, id } = await held();
    await duringOutage(() => rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(502));
    const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
    await signedEvent('charge.failed', { id: 'ch_never_stored', object: 'charge', amount: 9000, currency: 'eur', metadata: { paymentId: String(payment.id) }, failure_message: 'Your card was declined.' }).expect(200);
    expect((await payment.reload()).status).toBe('failed');
    expect((await Consultation.findByPk(id))!.status).toBe('cancelled');
  });
});

describe('a refund during a Stripe outage', () => {
  it('cancels now, keeps the refund pending, and the refund job pays it and sends the notice once', async () => {
    const { rider, id, payment } = await paid();
    const res = await duringOutage(() => rider.post(`/api/consultations/${id}/cancel`, { reason: 'Plans changed' }).expect(200));
    expect(res.body).toMatchObject({ refundedMinor: 0, refundPendingMinor: 9000, consultation: { status: 'cancelled' } });
    const refund = (await Refund.findOne({ where: { paymentId: payment.id } }))!;
    expect(refund.status).toBe('pending');
    expect(await waitForMails(rider.user.email, { subject: /^Cancelled:/, timeoutMs: 500 })).toHaveLength(0);
    // A retry still says it is cancelled; the refund is not asked for twice.
    await rider.post(`/api/consultations/${id}/cancel`, {}).expect(409);
    expect(await Refund.count({ where: { paymentId: payment.id } })).toBe(1);

    await ScheduledJob.update({ runAt: new Date(Date.now() - 1000) }, { where: { uniqueKey: `refund:${refund.id}` } });
    await createAppScheduler(saddlestep.ctx).tick();
    await createAppScheduler(saddlestep.ctx).tick();
    expect((await refund.reload()).status).toBe('succeeded');
    expect((await payment.reload())).toMatchObject({ status: 'refunded', refundedMinor: 9000 });
    const notices = await waitForMails(rider.user.email, { subject: /^Cancelled:/, count: 2, timeoutMs: 1500 });
    expect(notices).toHaveLength(1);
    expect(notices[0]!.text).toContain('€90.00 is on its way back');
    const stripeRefunds = await saddlestep.ctx.stripe!.refunds.list({ charge: payment.stripeChargeId!, limit: 10 });
    expect(stripeRefunds.data).toHaveLength(1);
  });
});

describe('POST /api/admin/payments/:id/refund', () => {
  it('refunds once for a double submit with one attempt key and tells the rider once', async () => {
    const admin = await signedInAs(saddlestep.app, 'admin');
    const { rider, payment } = await paid();
    const body = { amountMinor: 2500, reason: 'Goodwill', idempotencyKey: randomUUID() };
    const [a, b] = await Promise.all([admin.post(`/api/admin/payments/${payment.id}/refund`, body), admin.post(`/api/admin/payments/${payment.id}/refund`, body)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect(await Refund.count({ where: { paymentId: payment.id } })).toBe(1);
    expect((await payment.reload())).toMatchObject({ refundedMinor: 2500, status: 'partially_refunded' });
    expect((await saddlestep.ctx.stripe!.refunds.list({ charge: payment.stripeChargeId!, limit: 10 })).data).toHaveLength(1);
    const notices = await waitForMails(rider.user.email, { subject: /^Refund:/, count: 2, timeoutMs: 1500 });
    expect(notices).toHaveLength(1);
    expect(notices[0]!.subject).toContain('€25.00');
    expect(`${notices[0]!.text}`).not.toContain('Goodwill');
  });

  it('lets only one of two simultaneous full refunds through', async () => {
    const admin = await signedInAs(saddlestep.app, 'admin');
    const { payment } = await paid();
    const send = () => admin.post(`/api/admin/payments/${payment.id}/refund`, { amountMinor: 9000, reason: 'Session cancelled by phone', idempotencyKey: randomUUID() });
    const results = await Promise.all([send(), send()]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    expect((await payment.reload()).refundedMinor).toBe(9000);
    expect(await Refund.count({ where: { paymentId: payment.id } })).toBe(1);
  });

  it('refuses a bad attempt id with 400 and writes nothing', async () => {
    const admin = await signedInAs(saddlestep.app, 'admin');
    const { payment } = await paid();
    const res = await admin.post(`/api/admin/payments/${payment.id}/refund`, { amountMinor: 100, reason: 'x', idempotencyKey: 'not-a-uuid' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.idempotencyKey).toMatch(/reload/);
    expect(await Refund.count({ where: { paymentId: payment.id } })).toBe(0);
  });
});
