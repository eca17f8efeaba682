import type { RequestHandler } from 'express';
import type { AccountSettings } from '@shared/auth';
import { notSignedIn } from '../errors';
import { User } from '../models';
import { presentUser } from '../presenters/user';
import { actorFromRequest, recordAudit } from '../services/audit';

/**
 * The signed-in person's own settings. A rider who moved, or registered in the wrong zone, sees
 * slots, bookings and e-mails in the new zone from the next page on; times are stored in UTC.
 */
export const updateAccount: RequestHandler = async (req, res) => {
  if (!req.user) throw notSignedIn();
  const input = req.body as AccountSettings;
  const user = await User.findByPk(req.user.id);
  if (!user) throw notSignedIn();
  const changed = (['displayName', 'timeZone'] as const).filter((field) => user[field] !== input[field]);
  if (changed.length > 0) {
    await user.update({ displayName: input.displayName, timeZone: input.timeZone });
    await recordAudit(actorFromRequest(req), { action: 'account.settings_changed', subjectType: 'user', subjectId: user.id, subjectUserId: user.id, detail: { fields: changed } });
  }
  res.json({ user: presentUser(user) });
};
