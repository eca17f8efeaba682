import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Bike, Intake, RiderProfile, SetupSnapshot, User } from '@server/models';
import { seedDemo } from '@server/seed/demo';
import { createPasswordHasher } from '@server/services/passwords';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';

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
});
