import type { RequestHandler } from 'express';
import type { ProfileParsed } from '@shared/rider';
import type { LengthUnit } from '@shared/units';
import { presentProfile } from '../presenters/rider';
import { actorFromRequest } from '../services/audit';
import { readProfile, saveProfile, setUnitPreference } from '../services/rider-profile';

export const show: RequestHandler = async (req, res) => {
  const profile = await readProfile(req.user!.id, actorFromRequest(req));
  res.json({ profile: presentProfile(profile) });
};

export const save: RequestHandler = async (req, res) => {
  const profile = await saveProfile(req.user!.id, req.body as ProfileParsed, actorFromRequest(req));
  res.json({ profile: presentProfile(profile) });
};

export const saveUnit: RequestHandler = async (req, res) => {
  const unit = await setUnitPreference(req.user!.id, (req.body as { unit: LengthUnit }).unit);
  res.json({ unit });
};
