import type { RequestHandler } from 'express';
import { User } from '../models';
import { presentUser } from '../presenters/user';

/**
 * What each role's home page starts from. The lists are real queries' results once later
 * features land; today they are honestly empty and the client shows its empty states.
 */
export const riderHome: RequestHandler = (req, res) => {
  res.json({
    greetingName: req.user!.displayName,
    nextAction: { kind: 'tell_us_what_hurts' as const },
    bikes: [],
    consultations: [],
    activePlan: null,
  });
};

export const fitterHome: RequestHandler = (req, res) => {
  res.json({ greetingName: req.user!.displayName, sessionsToday: [], checkInsDue: [], gettingWorse: [], referralsWaiting: [] });
};

export const physioHome: RequestHandler = (req, res) => {
  res.json({ greetingName: req.user!.displayName, referrals: [] });
};

export const adminHome: RequestHandler = async (req, res) => {
  const pending = await User.findAll({ where: { status: 'pending' }, order: [['createdAt', 'ASC']], limit: 100 });
  const counts = await User.count({ group: ['role'] });
  res.json({
    greetingName: req.user!.displayName,
    pendingAccounts: pending.map(presentUser),
    accountsByRole: Object.fromEntries(counts.map((row) => [row.role, row.count])),
  });
};
