import type { RequestHandler } from 'express';
import type { BikeCreateParsed, BikeUpdateParsed, SnapshotParsed } from '@shared/rider';
import { notFound } from '../errors';
import { parseId } from '../middleware/validate';
import { presentBike, presentSnapshot } from '../presenters/rider';
import { actorFromRequest } from '../services/audit';
import { addMeasuredSetup, bikeWithHistory, createBike, listBikes, retireBike, updateBike } from '../services/bikes';
import type { AppContext } from '../context';

function bikeId(raw: unknown): number {
  const id = parseId(typeof raw === 'string' ? raw : undefined);
  if (!id) throw notFound('That bike');
  return id;
}

export function createBikesController(ctx: AppContext) {
  const list: RequestHandler = async (req, res) => {
    const bikes = await listBikes(req.user!.id);
    res.json({ bikes: bikes.map((b) => presentBike(b.bike, b.current, b.snapshotCount)) });
  };

  const create: RequestHandler = async (req, res) => {
    const created = await createBike(ctx, req.user!.id, req.body as BikeCreateParsed, actorFromRequest(req));
    res.status(201).json({ bike: presentBike(created.bike, created.current, created.snapshotCount) });
  };

  const show: RequestHandler = async (req, res) => {
    const { bike, snapshots } = await bikeWithHistory(req.user!.id, bikeId(req.params.id));
    res.json({ bike: presentBike(bike, snapshots.at(-1) ?? null, snapshots.length), snapshots: snapshots.map(presentSnapshot) });
  };

  const update: RequestHandler = async (req, res) => {
    const id = bikeId(req.params.id);
    await updateBike(req.user!.id, id, req.body as BikeUpdateParsed, actorFromRequest(req));
    const { bike, snapshots } = await bikeWithHistory(req.user!.id, id);
    res.json({ bike: presentBike(bike, snapshots.at(-1) ?? null, snapshots.length) });
  };

  const retire: RequestHandler = async (req, res) => {
    await retireBike(req.user!.id, bikeId(req.params.id), actorFromRequest(req));
    res.status(204).end();
  };

  const addSnapshot: RequestHandler = async (req, res) => {
    const snapshot = await addMeasuredSetup(ctx, req.user!.id, bikeId(req.params.id), req.body as SnapshotParsed, actorFromRequest(req));
    res.status(201).json({ snapshot: presentSnapshot(snapshot) });
  };

  return { list, create, show, update, retire, addSnapshot };
}
