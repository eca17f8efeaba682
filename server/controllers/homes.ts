import type { RequestHandler } from 'express';
import { User } from '../models';
import { presentUser } from '../presenters/user';
import { riderNextAction } from '../services/rider-home';

/**
 * The rider's next step, worked out from their live data (see `services/rider-home.ts`). The
 * fitter's and physio's home pages read their own lists (follow-ups, sessions, the referral
 * inbox), so they need no home endpoint.
 */
export const riderHome: RequestHandler = async (req, res) => {
  res.json({ greetingName: req.user!.displayName, nextAction: await riderNextAction(req.user!.id) });
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
