import type { FitterProfile, User } from '../models';

/** What a rider sees when choosing a fitter. */
export function presentFitterCard(fitter: User, profile: FitterProfile) {
  return {
    id: fitter.id,
    displayName: fitter.displayName,
    timeZone: fitter.timeZone,
    bio: profile.bio,
    specialties: profile.specialties,
    languages: profile.languages,
    feeMinor: profile.feeMinor,
    currency: profile.currency,
    slotMinutes: profile.availability.slotMinutes,
  };
}
