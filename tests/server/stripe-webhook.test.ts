import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { Payment, StripeEvent } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { buildFitter, isoDateIn, riderReadyToBook } from '../support/booking-factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

/** A Stripe event body signed the way Stripe signs it, with the test stack's webhook secret. */
function signed(event: object, secret = process.env.STRIPE_WEBHOOK_SECRET!) {
  const payload = JSON.stringify(event);
  const header = saddlestep.ctx.stripe!.webhooks.generateTestHeaderString({ payload, secret });
  return { payload, header };
}

function post(payload: string, header?: string) {
  const req = request(saddlestep.app).post('/api/stripe/webhook').set('Content-Type', 'application/json');
  return (header ? req.set('Stripe-Signature', header) : req).send(payload);
}

async function paidCharge() {
  const { fitter } = await buildFitter();
  const rider = await riderReadyToBook(saddlestep.app);
  const slots = await rider.get(`/api/fitters/${fitter.id}/slots?from=${isoDateIn(12)}&to=${isoDateIn(12)}`).expect(200);
  const held = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: slots.body.slots[0].start }).expect(201);
  await rider.post(`/api/consultations/${held.body.consultation.id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
  return (await Payment.findOne({ where: { consultationId: held.body.consultation.id } }))!;
}

const refundEvent = (chargeId: string, amountRefunded: number) => ({
  id: `evt_${randomUUID().replace(/-/g, '')}`,
  object: 'event',
  type: 'charge.refunded',
  data: { object: { id: chargeId, object: 'charge', amount: 9000, amount_refunded: amountRefunded } },
});

describe('POST /api/stripe/webhook', () => {
  it('applies a signed event once and ignores its replay', async () => {
    const payment = await paidCharge();
    const event = refundEvent(payment.stripeChargeId!, 3000);
    const first = signed(event);
    const res = await post(first.payload, first.header).expect(200);
    expect(res.body).toEqual({ received: true, duplicate: false, type: 'charge.refunded' });
    await payment.reload();
    expect(payment).toMatchObject({ refundedMinor: 3000, status: 'partially_refunded' });

    const replay = signed(event);
    const again = await post(replay.payload, replay.header).expect(200);
    expect(again.body.duplicate).toBe(true);
    expect(await StripeEvent.count({ where: { id: event.id } })).toBe(1);
    await payment.reload();
    expect(payment.refundedMinor).toBe(3000);
  });

  it('refuses a bad signature with 400 and stores nothing', async () => {
    const event = refundEvent('ch_unknown', 100);
    const forged = signed(event, 'whsec_not_the_secret');
    const res = await post(forged.payload, forged.header);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('The webhook signature does not match.');
    expect(await StripeEvent.count({ where: { id: event.id } })).toBe(0);
  });

  it('refuses a missing signature and a tampered body', async () => {
    const event = refundEvent('ch_unknown', 100);
    const good = signed(event);
    await post(good.payload).expect(400);
    await post(good.payload.replace('100', '9000'), good.header).expect(400);
  });

  it('needs no session or CSRF token, and ignores events for unknown charges', async () => {
    const event = refundEvent('ch_we_never_made', 100);
    const { payload, header } = signed(event);
    const res = await post(payload, header).expect(200);
    expect(res.body.duplicate).toBe(false);
  });
});
