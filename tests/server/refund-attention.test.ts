import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { AuditEntry, Payment, Refund, ScheduledJob } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { refundJobKey } from '@server/services/refund-jobs';
import { startTestApp, browserLikeAgent } from '../support/app';
import { buildFitter, isoDateIn, riderReadyToBook } from '../support/booking-factories';
import { signedInAs } from '../support/factories';
import { waitForMails } from '../support/mail';
import { closedPortUrl, withStripeAt } from '../support/stripe-outage';
import { REFUSAL_MESSAGE, refundProxy } from '../support/stripe-refund-proxy';

/**
 * Refunds that need the studio: refused by Stripe, or still failing after every retry. Stripe's
 * failures are real ones: a closed port (an outage) and a proxy in front of the Stripe fake.
 */
let saddlestep: SaddlestepApp;
let closedPort: string;
let admin: Awaited<ReturnType<typeof signedInAs>>;

beforeAll(async () => {
  saddlestep = await startTestApp();
  closedPort = await closedPortUrl();
  admin = await signedInAs(saddlestep.app, 'admin');
});
afterAll(async () => {
  await saddlestep.close();
});

const duringOutage = <T>(work: () => Promise<T>) => withStripeAt(saddlestep.ctx, closedPort, work);

/** Run `work` with refund requests going through a proxy with this fault. */
async function throughProxy<T>(fault: Parameters<typeof refundProxy>[0], work: () => Promise<T>): Promise<T> {
  const proxy = await refundProxy(fault);
  try {
    return await withStripeAt(saddlestep.ctx, proxy.url, work);
  } finally {
    await proxy.close();
  }
}

/** A booked session paid with Stripe's test Visa (9000 minor units, EUR). */
async function paid() {
  const { fitter } = await buildFitter();
  const rider = await riderReadyToBook(saddlestep.app);
  const slots = await rider.get(`/api/fitters/${fitter.id}/slots?from=${isoDateIn(11)}&to=${isoDateIn(11)}`).expect(200);
  const held = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: slots.body.slots[0].start }).expect(201);
  const id = held.body.consultation.id as number;
  await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
  const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
  return { rider, id, payment };
}

const refundOf = async (paymentId: number) => (await Refund.findOne({ where: { paymentId }, order: [['id', 'DESC']] }))!;
const stripeRefunds = async (payment: Payment) => (await saddlestep.ctx.stripe!.refunds.list({ charge: payment.stripeChargeId!, limit: 100 })).data;
const adminRefund = (paymentId: number, amountMinor: number) =>
  admin.post(`/api/admin/payments/${paymentId}/refund`, { amountMinor, reason: 'Goodwill: the rider mentioned a sore knee', idempotencyKey: randomUUID() });
const retry = (refundId: number, attemptKey: string = randomUUID(), as = admin) => as.post(`/api/admin/refunds/${refundId}/retry`, { attemptKey });

async function listed(refundId: number) {
  const res = await admin.get('/api/admin/refunds/attention').expect(200);
  return { entry: (res.body.refunds as { id: number }[]).find((r) => r.id === refundId) as Record<string, unknown> | undefined, text: res.text };
}

/** The refund job as if four retries had already failed, then its last retry during the outage: the scheduler gives up. */
async function useUpRetries(refundId: number) {
  await ScheduledJob.update({ attempts: 4, runAt: new Date(Date.now() - 1000) }, { where: { uniqueKey: refundJobKey(refundId) } });
  await duringOutage(() => createAppScheduler(saddlestep.ctx, { onlyKeys: [refundJobKey(refundId)] }).tick());
  expect((await ScheduledJob.findOne({ where: { uniqueKey: refundJobKey(refundId) } }))!.status).toBe('failed');
}

/** A cancellation whose refund could not reach Stripe, then every retry of it failed too. */
async function cancelledWithRefundGivenUp() {
  const booking = await paid();
  await duringOutage(() => booking.rider.post(`/api/consultations/${booking.id}/cancel`, { reason: 'Plans changed' }).expect(200));
  const refund = await refundOf(booking.payment.id);
  expect(refund.status).toBe('pending');
  expect((await listed(refund.id)).entry).toBeUndefined();
  await useUpRetries(refund.id);
  return { ...booking, refund };
}

const inMinutes = (minutes: number) => new Date(Date.now() + minutes * 60_000);
/** Run a refund's job; by default 3 minutes on, as jobs wait 2 minutes after the request's own try (SAFETY_NET_DELAY_MS). */
const runRefundJob = (refundId: number, at = inMinutes(3)) => createAppScheduler(saddlestep.ctx, { onlyKeys: [refundJobKey(refundId)] }).tick(at);

const retryAudits = (paymentId: number) => AuditEntry.count({ where: { action: 'payment.refund_retry', subjectType: 'payment', subjectId: String(paymentId) } });

describe('GET /api/admin/refunds/attention', () => {
  it('lists a refund Stripe refused with its message, amount, currency, time and tries, and never its reason', async () => {
    const { payment } = await paid();
    const res = await throughProxy('refuse', () => adminRefund(payment.id, 2500).expect(200));
    expect(res.body.refund).toMatchObject({ status: 'failed' });
    const { entry, text } = await listed(res.body.refund.id);
    expect(entry).toMatchObject({
      paymentId: payment.id,
      consultationId: payment.consultationId,
      amountMinor: 2500,
      currency: 'EUR',
      status: 'failed',
      problem: 'refused',
      cause: 'admin',
      lastError: REFUSAL_MESSAGE,
      attempts: 1,
    });
    expect(Date.parse(String(entry!.createdAt))).toBeGreaterThan(Date.now() - 60_000);
    expect(text).not.toMatch(/knee|Goodwill/);
  });

  it('lists a pending refund once the scheduler gave up on it, with the connection error and every try counted', async () => {
    const { refund, payment } = await cancelledWithRefundGivenUp();
    const { entry } = await listed(refund.id);
    expect(entry).toMatchObject({ paymentId: payment.id, status: 'pending', problem: 'gave-up', cause: 'cancellation', amountMinor: 9000, attempts: 2 });
    expect(entry!.lastError).toMatch(/connect/i);
  });

  it('lists a pending refund nothing has retried for longer than a scheduler would wait', async () => {
    const { rider, id, payment } = await paid();
    await duringOutage(() => rider.post(`/api/consultations/${id}/cancel`, {}).expect(200));
    const refund = await refundOf(payment.id);
    await ScheduledJob.update({ runAt: new Date(Date.now() - 11 * 60_000) }, { where: { uniqueKey: refundJobKey(refund.id) } });
    expect((await listed(refund.id)).entry).toMatchObject({ status: 'pending', problem: 'stalled' });
  });

  it('is for admins only: riders, fitters and physiotherapists get 403, and nobody signed in 401', async () => {
    for (const role of ['rider', 'fitter', 'physio'] as const) {
      const other = await signedInAs(saddlestep.app, role);
      const list = await other.get('/api/admin/refunds/attention');
      expect(list.status, role).toBe(403);
      expect(list.body.error.message).toBe('This page is for another kind of account.');
      expect((await retry(4_294_967_295, randomUUID(), other)).status, role).toBe(403);
    }
    const anonymous = await browserLikeAgent(saddlestep.app);
    expect((await anonymous.get('/api/admin/refunds/attention')).status).toBe(401);
  });
});

describe('POST /api/admin/refunds/:id/retry', () => {
  it('sends a refund the scheduler gave up on once Stripe is back: one refund for a double press, one e-mail, one audit row', async () => {
    const { rider, refund, payment } = await cancelledWithRefundGivenUp();
    const attemptKey = randomUUID();
    const [a, b] = await Promise.all([retry(refund.id, attemptKey), retry(refund.id, attemptKey)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect((await refund.reload()).status).toBe('succeeded');
    expect(await stripeRefunds(payment)).toHaveLength(1);
    expect(await payment.reload()).toMatchObject({ status: 'refunded', refundedMinor: 9000 });
    expect(await retryAudits(payment.id)).toBe(1);
    expect((await listed(refund.id)).entry).toBeUndefined();

    // The re-queued job is only a safety net: when it runs it finds the refund made.
    await runRefundJob(refund.id, inMinutes(3));
    expect(await stripeRefunds(payment)).toHaveLength(1);
    const notices = await waitForMails(rider.user.email, { subject: /^Cancelled:/, count: 2, timeoutMs: 1500 });
    expect(notices).toHaveLength(1);
    expect(notices[0]!.text).toContain('€90.00 is on its way back');

    const again = await retry(refund.id);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe('This refund has already gone through. There is nothing to try again.');
  });

  it('sends a refused refund again as the same refund, and tells the rider it went through after all', async () => {
    const { rider, payment } = await paid();
    const refused = await throughProxy('refuse', () => adminRefund(payment.id, 2500).expect(200));
    const refundId = refused.body.refund.id as number;
    // The refund job tells the rider the refund failed.
    await runRefundJob(refundId);
    expect(await waitForMails(rider.user.email, { subject: /studio will contact you/ })).toHaveLength(1);

    // Two presses with different attempt ids at once: the refund row's lock lets one through.
    const results = await Promise.all([retry(refundId), retry(refundId)]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    const ok = results.find((r) => r.status === 200)!;
    expect(ok.body.refund).toMatchObject({ id: refundId, status: 'succeeded', amountMinor: 2500, currency: 'EUR', lastError: null, attempts: 2 });
    expect(await stripeRefunds(payment)).toHaveLength(1);
    expect(await payment.reload()).toMatchObject({ status: 'partially_refunded', refundedMinor: 2500 });
    expect(await retryAudits(payment.id)).toBe(1);
    await runRefundJob(refundId, inMinutes(3));
    const sent = await waitForMails(rider.user.email, { subject: /^Refund: €25\.00/, count: 2, timeoutMs: 1500 });
    expect(sent).toHaveLength(1);
    expect(sent[0]!.text).not.toMatch(/knee|Goodwill/);
  });

  it('gets the same refusal again when Stripe kept it under the key, and makes no second refund or e-mail', async () => {
    const { rider, payment } = await paid();
    // Refunded in full at Stripe directly (as from Stripe's dashboard): Stripe then refuses ours and keeps that answer.
    await saddlestep.ctx.stripe!.refunds.create({ charge: payment.stripeChargeId! });
    const refused = await adminRefund(payment.id, 2500).expect(200);
    expect(refused.body.refund.status).toBe('failed');
    await runRefundJob(refused.body.refund.id as number);
    expect(await waitForMails(rider.user.email, { subject: /studio will contact you/ })).toHaveLength(1);
    const res = await retry(refused.body.refund.id as number).expect(200);
    expect(res.body.refund).toMatchObject({ status: 'failed', attempts: 2 });
    expect(res.body.refund.lastError).toMatch(/already been refunded/);
    expect(await stripeRefunds(payment)).toHaveLength(1);
    expect((await listed(res.body.refund.id as number)).entry).toMatchObject({ problem: 'refused', attempts: 2 });
    // The rider was told once that it failed; the re-queued job does not tell them again.
    await runRefundJob(res.body.refund.id as number, inMinutes(3));
    expect(await waitForMails(rider.user.email, { subject: /^Refund:/, count: 2, timeoutMs: 1500 })).toHaveLength(1);
  });

  it('asks Stripe first, so a try whose answer was lost is not made again after Stripe forgot the key', async () => {
    const { payment } = await paid();
    const lost = await throughProxy('lose-answer', () => adminRefund(payment.id, 2500).expect(200));
    const refundId = lost.body.refund.id as number;
    expect(lost.body.refund.status).toBe('pending');
    const [madeAtStripe] = await stripeRefunds(payment);
    expect(madeAtStripe).toBeDefined();
    await useUpRetries(refundId);

    const res = await throughProxy('forget-key', () => retry(refundId).expect(200));
    expect(res.body.refund).toMatchObject({ status: 'succeeded' });
    expect((await Refund.findByPk(refundId))!.stripeRefundId).toBe(madeAtStripe!.id);
    expect(await stripeRefunds(payment)).toHaveLength(1);
    expect(await payment.reload()).toMatchObject({ refundedMinor: 2500 });
  });

  it('refuses with 409 a refund still being retried, and a refused one the payment no longer covers', async () => {
    const { rider, id, payment } = await paid();
    await duringOutage(() => rider.post(`/api/consultations/${id}/cancel`, {}).expect(200));
    const queued = await retry((await refundOf(payment.id)).id);
    expect(queued.status).toBe(409);
    expect(queued.body.error.message).toMatch(/already being tried again/);

    const other = await paid();
    const refused = await throughProxy('refuse', () => adminRefund(other.payment.id, 9000).expect(200));
    await adminRefund(other.payment.id, 9000).expect(200);
    const res = await retry(refused.body.refund.id as number);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe(
      'Only €0.00 of this payment is left to refund, less than this refund of €90.00. It may have been refunded another way; use Refund on the payment for what is left.',
    );
    expect(await stripeRefunds(other.payment)).toHaveLength(1);
    expect(await retryAudits(other.payment.id)).toBe(0);
  });

  it('answers unknown or malformed ids with 404 and a bad body with 400, changing nothing', async () => {
    for (const id of ['4294967295', '0', 'abc', '12.5', '99999999999']) {
      const res = await admin.post(`/api/admin/refunds/${id}/retry`, { attemptKey: randomUUID() });
      expect(res.status, id).toBe(404);
      expect(res.body.error.message).toBe('That refund was not found.');
    }
    const { payment } = await paid();
    const refused = await throughProxy('refuse', () => adminRefund(payment.id, 1000).expect(200));
    const refundId = refused.body.refund.id as number;
    for (const body of [{}, { attemptKey: 'not-a-uuid' }, { attemptKey: randomUUID(), extra: true }]) {
      const res = await admin.post(`/api/admin/refunds/${refundId}/retry`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
    }
    const missing = await admin.post(`/api/admin/refunds/${refundId}/retry`, {});
    expect(missing.body.error.fields.attemptKey).toBe('The retry attempt id is not valid; reload the page.');
    expect((await Refund.findByPk(refundId))!.status).toBe('failed');
    expect(await retryAudits(payment.id)).toBe(0);
  });
});
