import type { Transaction } from 'sequelize';
import { setupSchema, type Setup } from '@shared/fit/setup';
import type { SnapshotSource } from '@shared/rider';
import { badRequest } from '../errors';
import { fieldErrors } from '../middleware/validate';
import { SetupSnapshot } from '../models';

export interface SnapshotOptions {
  /** The plan step applied ('step' snapshots, issue 5). */
  stepId?: number;
  /** The earlier snapshot a 'revert' goes back to. */
  basedOnSnapshotId?: number;
  cleatNotes?: string;
  /** YYYY-MM-DD; today (UTC) when absent. */
  takenOn?: string;
  transaction?: Transaction;
}

/**
 * Append one snapshot of a bike's whole setup. The only way a setup changes: baseline on
 * creation, a re-measure, a plan step, or a "go back to this". The setup is re-checked against
 * the shared schema whoever calls, so no code path can store an implausible value. The caller
 * has already checked that `actorId` may change this bike.
 */
export async function recordSnapshot(bikeId: number, setup: Setup, source: SnapshotSource, actorId: number, options: SnapshotOptions = {}): Promise<SetupSnapshot> {
  const parsed = setupSchema.safeParse(setup);
  if (!parsed.success) throw badRequest('That setup has values we cannot store.', fieldErrors(parsed.error));
  if (source === 'revert' && !options.basedOnSnapshotId) throw badRequest('Say which earlier setup to go back to.');
  return SetupSnapshot.create(
    {
      bikeId,
      setup: parsed.data,
      cleatNotes: options.cleatNotes ?? '',
      source,
      stepId: options.stepId ?? null,
      basedOnSnapshotId: options.basedOnSnapshotId ?? null,
      takenOn: options.takenOn ?? new Date().toISOString().slice(0, 10),
      createdBy: actorId,
    },
    { transaction: options.transaction },
  );
}

/** The bike's setup history, oldest first (ids grow with time; two snapshots can share a date). */
export function listSnapshots(bikeId: number, options: { transaction?: Transaction } = {}): Promise<SetupSnapshot[]> {
  return SetupSnapshot.findAll({ where: { bikeId }, order: [['id', 'ASC']], transaction: options.transaction });
}

/** What is on the bike now: the newest snapshot, or null for a bike with no history. */
export function currentSnapshot(bikeId: number, options: { transaction?: Transaction } = {}): Promise<SetupSnapshot | null> {
  return SetupSnapshot.findOne({ where: { bikeId }, order: [['id', 'DESC']], transaction: options.transaction });
}

/** The current setup alone, for the planner. */
export async function currentSetup(bikeId: number, options: { transaction?: Transaction } = {}): Promise<Setup | null> {
  return (await currentSnapshot(bikeId, options))?.setup ?? null;
}
