import type { RequestHandler } from 'express';
import { slotRangeSchema, type fitterSettingsSchema } from '@shared/booking';
import type { z } from 'zod';
import { notFound } from '../errors';
import { parseId, parseOrThrow } from '../middleware/validate';
import { FitterProfile } from '../models';
import { presentFitterCard } from '../presenters/fitter';
import { emptyAvailability, getPublishedFitter, listPublishedFitters, saveFitterProfile, slotsForFitter } from '../services/fitters';
import { getClinicSettings } from '../services/clinic-settings';
import { actorFromRequest, recordAudit } from '../services/audit';

export const list: RequestHandler = async (_req, res) => {
  const fitters = await listPublishedFitters();
  res.json({ fitters: fitters.map(({ fitter, profile }) => presentFitterCard(fitter, profile)) });
};

export const slots: RequestHandler = async (req, res) => {
  const id = parseId(req.params.id as string);
  // A fitter sees only their own calendar (to move a session); riders see any published fitter's.
  if (!id || (req.user!.role === 'fitter' && req.user!.id !== id)) throw notFound('That fitter');
  const range = parseOrThrow(slotRangeSchema, req.query);
  const { fitter, profile } = await getPublishedFitter(id);
  res.json({ fitter: presentFitterCard(fitter, profile), slots: await slotsForFitter(fitter, profile, range.from, range.to) });
};

/** The signed-in fitter's own settings, or sensible starting values from the clinic policy. */
export const ownSettings: RequestHandler = async (req, res) => {
  const fitter = req.user!;
  const profile = await FitterProfile.findByPk(fitter.id);
  const clinic = await getClinicSettings();
  res.json({
    profile: {
      bio: profile?.bio ?? '',
      specialties: profile?.specialties ?? [],
      languages: profile?.languages ?? ['English'],
      feeMinor: profile?.feeMinor ?? clinic.defaultFeeMinor,
      currency: profile?.currency ?? clinic.currency,
      timeZone: fitter.timeZone,
      published: profile?.published ?? false,
    },
    availability: toClock(profile?.availability ?? emptyAvailability()),
  });
};

export const saveSettings: RequestHandler = async (req, res) => {
  const body = req.body as z.output<typeof fitterSettingsSchema>;
  const saved = await saveFitterProfile(req.user!, body.profile, body.availability);
  await recordAudit(actorFromRequest(req), { action: 'fitter.settings', subjectType: 'user', subjectId: req.user!.id });
  res.json({ saved: true, published: saved.published });
};

const pad = (n: number) => String(n).padStart(2, '0');
const clock = (minutes: number) => `${pad(Math.floor(minutes / 60))}:${pad(minutes % 60)}`;

/** Availability is stored in minutes; the form edits "HH:MM". */
function toClock(a: ReturnType<typeof emptyAvailability>) {
  return {
    ...a,
    windows: a.windows.map((w) => ({ ...w, start: clock(w.start), end: clock(w.end) })),
    exceptions: a.exceptions.map((e) => ({ ...e, start: e.start === undefined ? undefined : clock(e.start), end: e.end === undefined ? undefined : clock(e.end) })),
  };
}
