import type { LengthUnit } from '@shared/units';
import type { ProfileParsed } from '@shared/rider';
import { keepIfSameWhenShown } from '@shared/length-entry';
import { RiderProfile } from '../models';
import { recordAudit, type AuditActor } from './audit';

/** The rider's profile, or null before they first save it. Injury history is health data: audited. */
export async function readProfile(riderId: number, actor: AuditActor): Promise<RiderProfile | null> {
  const profile = await RiderProfile.findByPk(riderId);
  await recordAudit(actor, { action: 'profile.read', subjectType: 'rider_profile', subjectId: riderId, subjectUserId: riderId });
  return profile;
}

/** Replace the whole profile (a form saves every field); lengths arrive in millimetres. */
export async function saveProfile(riderId: number, input: ProfileParsed, actor: AuditActor): Promise<RiderProfile> {
  const before = await RiderProfile.findByPk(riderId);
  // A figure that reads the same as the stored one in the rider's unit is the stored one, not a
  // rounding of it (1750 mm shows as 68.9 in, and 68.9 in alone would store 1750.1 mm).
  const keep = (typed: number | null, stored: number | null | undefined) => (typed === null ? null : keepIfSameWhenShown(typed, stored, input.unit));
  const values = {
    unitPreference: input.unit,
    heightMm: keep(input.height, before?.heightMm),
    inseamMm: keep(input.inseam, before?.inseamMm),
    birthYear: input.birthYear,
    flexibility: input.flexibility,
    ridingStyle: input.ridingStyle,
    hoursPerWeek: input.hoursPerWeek,
    ridesPerWeek: input.ridesPerWeek,
    injuryHistory: input.injuryHistory,
  };
  const [profile] = await RiderProfile.upsert({ userId: riderId, ...values });
  await recordAudit(actor, { action: 'profile.update', subjectType: 'rider_profile', subjectId: riderId, subjectUserId: riderId });
  return (await RiderProfile.findByPk(riderId)) ?? profile;
}

export async function setUnitPreference(riderId: number, unit: LengthUnit): Promise<LengthUnit> {
  const existing = await RiderProfile.findByPk(riderId);
  if (existing) await existing.update({ unitPreference: unit });
  else await RiderProfile.create({ userId: riderId, unitPreference: unit, heightMm: null, inseamMm: null, birthYear: null, flexibility: null, ridingStyle: null, hoursPerWeek: null, ridesPerWeek: null, injuryHistory: '' });
  return unit;
}
