import { Op, fn, col } from 'sequelize';
import { BIKE_LIMITS, keepShownLengths, type BikeCreateParsed, type BikeUpdateParsed, type SnapshotParsed } from '@shared/rider';
import { conflict, notFound } from '../errors';
import { Bike, SetupSnapshot } from '../models';
import type { AppContext } from '../context';
import { recordAudit, type AuditActor } from './audit';
import { currentSnapshot, listSnapshots, recordSnapshot } from './setup-history';

export interface BikeWithCurrent {
  bike: Bike;
  current: SetupSnapshot | null;
  snapshotCount: number;
}

/** A bike the rider owns and has not retired; anything else is "not found". */
export async function getOwnBike(riderId: number, bikeId: number): Promise<Bike> {
  const bike = await Bike.findOne({ where: { id: bikeId, riderId, retiredAt: null } });
  if (!bike) throw notFound('That bike');
  return bike;
}

export async function listBikes(riderId: number): Promise<BikeWithCurrent[]> {
  const bikes = await Bike.findAll({ where: { riderId, retiredAt: null }, order: [['id', 'ASC']] });
  if (bikes.length === 0) return [];
  const ids = bikes.map((b) => b.id);
  const latest = await SetupSnapshot.findAll({
    attributes: ['bikeId', [fn('MAX', col('id')), 'latestId'], [fn('COUNT', col('id')), 'count']],
    where: { bikeId: { [Op.in]: ids } },
    group: ['bikeId'],
    raw: true,
  }) as unknown as { bikeId: number; latestId: number; count: number }[];
  const snapshots = await SetupSnapshot.findAll({ where: { id: { [Op.in]: latest.map((l) => l.latestId) } } });
  return bikes.map((bike) => {
    const row = latest.find((l) => l.bikeId === bike.id);
    return { bike, current: snapshots.find((s) => s.bikeId === bike.id) ?? null, snapshotCount: Number(row?.count ?? 0) };
  });
}

/** A new bike and its baseline snapshot, both or neither. */
export async function createBike(ctx: AppContext, riderId: number, input: BikeCreateParsed, actor: AuditActor): Promise<BikeWithCurrent> {
  return ctx.sequelize.transaction(async (transaction) => {
    const active = await Bike.count({ where: { riderId, retiredAt: null }, transaction });
    if (active >= BIKE_LIMITS.bikesPerRider) throw conflict(`You can keep up to ${BIKE_LIMITS.bikesPerRider} bikes. Retire one you no longer ride first.`);
    const bike = await Bike.create({ riderId, name: input.name, kind: input.kind, notes: input.notes }, { transaction });
    const baseline = await recordSnapshot(bike.id, input.baseline.setup, 'baseline', riderId, {
      cleatNotes: input.baseline.cleatNotes,
      takenOn: input.baseline.takenOn,
      transaction,
    });
    await recordAudit(actor, { action: 'bike.create', subjectType: 'bike', subjectId: bike.id, subjectUserId: riderId }, { transaction });
    return { bike, current: baseline, snapshotCount: 1 };
  });
}

export async function updateBike(riderId: number, bikeId: number, input: BikeUpdateParsed, actor: AuditActor): Promise<Bike> {
  const bike = await getOwnBike(riderId, bikeId);
  await bike.update(input);
  await recordAudit(actor, { action: 'bike.update', subjectType: 'bike', subjectId: bike.id, subjectUserId: riderId, detail: { fields: Object.keys(input) } });
  return bike;
}

/** Retire: the bike leaves the lists; its history stays, because plans and check-ins point at it. */
export async function retireBike(riderId: number, bikeId: number, actor: AuditActor): Promise<void> {
  const bike = await getOwnBike(riderId, bikeId);
  await bike.update({ retiredAt: new Date() });
  await recordAudit(actor, { action: 'bike.retire', subjectType: 'bike', subjectId: bike.id, subjectUserId: riderId });
}

/** The rider re-measured the bike: a 'manual' snapshot. */
export async function addMeasuredSetup(ctx: AppContext, riderId: number, bikeId: number, input: SnapshotParsed, actor: AuditActor): Promise<SetupSnapshot> {
  const bike = await getOwnBike(riderId, bikeId);
  return ctx.sequelize.transaction(async (transaction) => {
    // A figure that reads the same as today's in the rider's unit is today's value, not a rounding of it.
    const setup = keepShownLengths(input.setup, (await currentSnapshot(bike.id, { transaction }))?.setup ?? null, input.unit);
    const snapshot = await recordSnapshot(bike.id, setup, 'manual', riderId, { cleatNotes: input.cleatNotes, takenOn: input.takenOn, transaction });
    await recordAudit(actor, { action: 'setup.record', subjectType: 'bike', subjectId: bike.id, subjectUserId: riderId, detail: { snapshotId: snapshot.id, source: 'manual' } }, { transaction });
    return snapshot;
  });
}

export async function bikeWithHistory(riderId: number, bikeId: number): Promise<{ bike: Bike; snapshots: SetupSnapshot[] }> {
  const bike = await getOwnBike(riderId, bikeId);
  return { bike, snapshots: await listSnapshots(bike.id) };
}

export { currentSnapshot };
