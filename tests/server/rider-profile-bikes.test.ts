import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEntry, Bike, RiderProfile, SetupSnapshot } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { signedInAs } from '../support/factories';
import { bikeBody, roadSetup, today } from '../support/rider-factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

describe('GET and PUT /api/rider/profile', () => {
  it('starts empty in millimetres, then keeps what the rider saves', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const empty = await rider.get('/api/rider/profile').expect(200);
    expect(empty.body.profile).toMatchObject({ unit: 'mm', heightMm: null, inseamMm: null, injuryHistory: '' });

    const body = { unit: 'mm', height: 1780, inseam: 842, birthYear: 1986, flexibility: 'average', ridingStyle: 'road', hoursPerWeek: 6.5, ridesPerWeek: 4, injuryHistory: 'Left knee sprain in 2019, fully recovered.' };
    const saved = await rider.put('/api/rider/profile', body).expect(200);
    expect(saved.body.profile).toMatchObject({ unit: 'mm', heightMm: 1780, inseamMm: 842, birthYear: 1986, flexibility: 'average', ridingStyle: 'road', hoursPerWeek: 6.5, ridesPerWeek: 4 });
    const again = await rider.get('/api/rider/profile').expect(200);
    expect(again.body.profile.injuryHistory).toBe(body.injuryHistory);
  });

  it('converts lengths typed in inches and stores millimetres, and remembers the unit', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.put('/api/rider/profile', { unit: 'in', height: 70, inseam: 33.5 }).expect(200);
    expect(res.body.profile).toMatchObject({ unit: 'in', heightMm: 1778, inseamMm: 850.9 });
    const row = await RiderProfile.findByPk(rider.user.id);
    expect(row?.inseamMm).toBe(850.9); // 33.5 in × 25.4 mm (exact by definition)
    expect(row?.unitPreference).toBe('in');
  });

  it('keeps the stored millimetres when inches that read the same come back (68.9 in for 1750 mm)', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await rider.put('/api/rider/profile', { unit: 'mm', height: 1750, inseam: 820 }).expect(200);
    // 68.9 in alone is 1750.1 mm and 32.28 in is 819.9 mm: rounding, not a new measurement.
    const same = await rider.put('/api/rider/profile', { unit: 'in', height: 68.9, inseam: 32.28 }).expect(200);
    expect(same.body.profile).toMatchObject({ heightMm: 1750, inseamMm: 820 });
    const moved = await rider.put('/api/rider/profile', { unit: 'in', height: 68.9, inseam: 32.5 }).expect(200);
    expect(moved.body.profile).toMatchObject({ heightMm: 1750, inseamMm: 825.5 });
  });

  it('quotes the limits in the unit the rider typed', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.put('/api/rider/profile', { unit: 'in', inseam: 80 }).expect(400);
    expect(res.body.error.fields.inseam).toMatch(/at most 43\.31 in/);
    expect(await RiderProfile.count({ where: { userId: rider.user.id } })).toBe(0);
  });

  it('saves the unit preference on its own', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await rider.put('/api/rider/unit-preference', { unit: 'in' }).expect(200, { unit: 'in' });
    expect((await rider.get('/api/rider/profile')).body.profile.unit).toBe('in');
  });

  it('audits reads and writes of the profile (injury history is health data)', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await rider.put('/api/rider/profile', { unit: 'mm', injuryHistory: 'None' }).expect(200);
    await rider.get('/api/rider/profile').expect(200);
    const actions = (await AuditEntry.findAll({ where: { subjectUserId: rider.user.id } })).map((a) => a.action);
    expect(actions).toEqual(expect.arrayContaining(['profile.update', 'profile.read']));
  });
});

describe('bikes and their setup history', () => {
  it('creates a bike with a dated baseline snapshot and lists it with its current setup', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.post('/api/rider/bikes', bikeBody()).expect(201);
    expect(res.body.bike).toMatchObject({ name: 'Grey test road bike', kind: 'road', snapshotCount: 1 });
    expect(res.body.bike.current).toMatchObject({ source: 'baseline', takenOn: today(), setup: roadSetup(), cleatNotes: 'Cleats centred', createdById: rider.user.id });
    const list = await rider.get('/api/rider/bikes').expect(200);
    expect(list.body.bikes).toHaveLength(1);
    expect(list.body.bikes[0].current.setup.saddleHeight).toBe(742);
  });

  it('takes a baseline typed in inches and stores millimetres, degrees unchanged', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const inches = { saddleHeight: 29.25, saddleSetback: 2.5, saddleTilt: -1.5, reach: 21.5, drop: 2.75, stemLength: 3.94, spacerStack: 0.8, crankLength: 6.79, stack: 0.83, cleatForeAft: 0, cleatRotation: 2 };
    const res = await rider.post('/api/rider/bikes', bikeBody({ baseline: { unit: 'in', setup: inches, takenOn: today() } })).expect(201);
    const stored = await SetupSnapshot.findByPk(res.body.bike.current.id);
    expect(stored?.setup).toMatchObject({ saddleHeight: 743, saddleSetback: 63.5, saddleTilt: -1.5, reach: 546.1, crankLength: 172.5, cleatRotation: 2 });
  });

  it('appends re-measured setups as new snapshots and keeps the baseline untouched', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const bike = (await rider.post('/api/rider/bikes', bikeBody()).expect(201)).body.bike;
    await rider.post(`/api/rider/bikes/${bike.id}/snapshots`, { unit: 'mm', setup: roadSetup({ saddleHeight: 745 }), takenOn: today() }).expect(201);
    const detail = await rider.get(`/api/rider/bikes/${bike.id}`).expect(200);
    expect(detail.body.snapshots.map((s: { source: string; setup: { saddleHeight: number } }) => [s.source, s.setup.saddleHeight])).toEqual([['baseline', 742], ['manual', 745]]);
    expect(detail.body.bike.current.setup.saddleHeight).toBe(745);
  });

  it('records a re-measure in rounded inches that reads the same as today as today’s exact millimetres', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const setup = roadSetup({ saddleHeight: 720, saddleSetback: 60, reach: 520, drop: 100, spacerStack: 20 });
    const bike = await rider.post('/api/rider/bikes', bikeBody({ baseline: { unit: 'mm', setup, takenOn: today() } })).expect(201);
    // What a form rounding to 0.01 in sends back: 28.35 in alone would be 720.1 mm, 2.36 in 59.9 mm.
    const inches = { ...setup, saddleHeight: 28.35, saddleSetback: 2.36, reach: 20.47, drop: 3.94, stemLength: 4.33, spacerStack: 0.79, crankLength: 6.79, stack: 0.83 };
    const res = await rider.post(`/api/rider/bikes/${bike.body.bike.id}/snapshots`, { unit: 'in', setup: inches, takenOn: today() }).expect(201);
    // Only the stem, which the rider really changed (100 → 110 mm), moves.
    expect(res.body.snapshot.setup).toEqual({ ...setup, stemLength: 110 });
  });

  it('refuses to edit or delete a snapshot through the model (append-only)', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const bike = (await rider.post('/api/rider/bikes', bikeBody()).expect(201)).body.bike;
    const snapshot = await SetupSnapshot.findByPk(bike.current.id);
    await expect(snapshot!.update({ cleatNotes: 'changed' })).rejects.toThrow(/append-only/);
    await expect(snapshot!.destroy()).rejects.toThrow(/append-only/);
  });

  it('renames a bike and retires it, keeping its history', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const bike = (await rider.post('/api/rider/bikes', bikeBody()).expect(201)).body.bike;
    const renamed = await rider.patch(`/api/rider/bikes/${bike.id}`, { name: 'Winter bike', kind: 'gravel' }).expect(200);
    expect(renamed.body.bike).toMatchObject({ name: 'Winter bike', kind: 'gravel' });
    await rider.delete(`/api/rider/bikes/${bike.id}`).expect(204);
    expect((await rider.get('/api/rider/bikes')).body.bikes).toHaveLength(0);
    await rider.get(`/api/rider/bikes/${bike.id}`).expect(404);
    expect(await SetupSnapshot.count({ where: { bikeId: bike.id } })).toBe(1);
  });

  it("answers 404 for another rider's bike, for reading, editing and adding setups", async () => {
    const owner = await signedInAs(saddlestep.app, 'rider');
    const other = await signedInAs(saddlestep.app, 'rider');
    const bike = (await owner.post('/api/rider/bikes', bikeBody()).expect(201)).body.bike;
    await other.get(`/api/rider/bikes/${bike.id}`).expect(404);
    await other.patch(`/api/rider/bikes/${bike.id}`, { name: 'Mine now' }).expect(404);
    await other.delete(`/api/rider/bikes/${bike.id}`).expect(404);
    await other.post(`/api/rider/bikes/${bike.id}/snapshots`, { unit: 'mm', setup: roadSetup(), takenOn: today() }).expect(404);
    expect((await Bike.findByPk(bike.id))?.name).toBe('Grey test road bike');
  });

  it('refuses an implausible setup with the field named and writes nothing', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.post('/api/rider/bikes', bikeBody({ baseline: { unit: 'mm', setup: roadSetup({ saddleHeight: 74.2 }), takenOn: today() } })).expect(400);
    expect(res.body.error.fields['baseline.setup.saddleHeight']).toMatch(/at least 300 mm/);
    expect(await Bike.count({ where: { riderId: rider.user.id } })).toBe(0);
  });

  it('refuses a baseline dated in the future', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.post('/api/rider/bikes', bikeBody({ baseline: { unit: 'mm', setup: roadSetup(), takenOn: '2999-01-01' } })).expect(400);
    expect(res.body.error.fields['baseline.takenOn']).toMatch(/future/);
  });
});
