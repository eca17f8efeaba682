import type { BikeView, ProfileView, SnapshotView } from '@shared/rider';
import type { Bike, RiderProfile, SetupSnapshot } from '../models';

/** The profile in millimetres; an unsaved profile shows as empty with the default unit. */
export function presentProfile(profile: RiderProfile | null): ProfileView {
  return {
    unit: profile?.unitPreference ?? 'mm',
    heightMm: profile?.heightMm ?? null,
    inseamMm: profile?.inseamMm ?? null,
    birthYear: profile?.birthYear ?? null,
    flexibility: profile?.flexibility ?? null,
    ridingStyle: profile?.ridingStyle ?? null,
    hoursPerWeek: profile?.hoursPerWeek ?? null,
    ridesPerWeek: profile?.ridesPerWeek ?? null,
    injuryHistory: profile?.injuryHistory ?? '',
    updatedAt: profile?.updatedAt ? profile.updatedAt.toISOString() : null,
  };
}

export function presentSnapshot(s: SetupSnapshot): SnapshotView {
  return {
    id: s.id,
    bikeId: s.bikeId,
    setup: s.setup,
    cleatNotes: s.cleatNotes,
    source: s.source,
    stepId: s.stepId,
    basedOnSnapshotId: s.basedOnSnapshotId,
    takenOn: s.takenOn,
    createdById: s.createdBy,
    createdAt: s.createdAt.toISOString(),
  };
}

export function presentBike(bike: Bike, current: SetupSnapshot | null, snapshotCount: number): BikeView {
  return {
    id: bike.id,
    name: bike.name,
    kind: bike.kind,
    notes: bike.notes,
    createdAt: bike.createdAt.toISOString(),
    current: current ? presentSnapshot(current) : null,
    snapshotCount,
  };
}
