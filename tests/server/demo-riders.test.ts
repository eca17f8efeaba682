import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { Bike, Consultation, Intake, Payment, RiderProfile, SetupSnapshot, User } from '@server/models';
import { seedDemo } from '@server/seed/demo';
import { createPasswordHasher } from '@server/services/passwords';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { signedInAs } from '../support/factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

const RIDERS = ['ben@rider.example', 'carla@rider.example', 'deshawn@rider.example'];

async function counts() {
  const ids = (await User.findAll({ where: { email: RIDERS } })).map((u) => u.id);
  const bikes = await Bike.findAll({ where: { riderId: ids } });
  return {
    profiles: await RiderProfile.count({ where: { userId: ids } }),
    bikes: bikes.length,
    snapshots: await SetupSnapshot.count({ where: { bikeId: bikes.map((b) => b.id) } }),
    intakes: await Intake.count({ where: { riderId: ids } }),
  };
}

describe('the demo riders', () => {
  it('each have a profile and a bike with a baseline; Ben has a submitted knee intake; seeding twice adds nothing', async () => {
    const hasher = createPasswordHasher(10);
    await seedDemo(saddlestep.ctx, hasher);
    const first = await counts();
    await seedDemo(saddlestep.ctx, hasher);
    expect(await counts()).toEqual(first);
    expect(first.profiles).toBe(3);
    expect(first.bikes).toBeGreaterThanOrEqual(3);

    const ben = await User.findOne({ where: { email: 'ben@rider.example' } });
    const intake = await Intake.findOne({ where: { riderId: ben!.id, status: 'submitted' } });
    expect(intake?.symptoms[0]).toMatchObject({ region: 'knee-front-left', pain: 5 });
    expect(intake?.triageLevel).toBe('none');
    expect(intake?.consentId).not.toBeNull();
    const baseline = await SetupSnapshot.findOne({ where: { bikeId: intake!.bikeId!, source: 'baseline' } });
    expect(baseline?.setup.saddleHeight).toBe(752);
  });

  it('have paid sessions: a real charge at the Stripe fake per session, which the clinic can refund', async () => {
    const hasher = createPasswordHasher(10);
    await seedDemo(saddlestep.ctx, hasher);
    await seedDemo(saddlestep.ctx, hasher);
    const riders = await User.findAll({ where: { email: RIDERS } });
    const sessions = await Consultation.findAll({ where: { riderId: riders.map((r) => r.id) } });
    expect(sessions.length).toBeGreaterThanOrEqual(2);
    for (const session of sessions) {
      const payments = await Payment.findAll({ where: { consultationId: session.id } });
      expect(payments, `session ${session.id}`).toHaveLength(1);
      expect(payments[0]).toMatchObject({ status: 'succeeded', amountMinor: session.feeMinor, currency: session.currency, stripeChargeId: expect.stringMatching(/^ch_/) });
    }
    const admin = await signedInAs(saddlestep.app, 'admin');
    const payment = (await Payment.findOne({ where: { consultationId: sessions[0]!.id } }))!;
    const refunded = await admin.post(`/api/admin/payments/${payment.id}/refund`, { amountMinor: 100, reason: 'Demo goodwill', idempotencyKey: randomUUID() });
    expect(refunded.status, JSON.stringify(refunded.body)).toBe(200);
    await payment.reload();
    expect(payment.refundedMinor).toBe(100);
  });
});
