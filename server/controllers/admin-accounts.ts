import type { RequestHandler } from 'express';
import type { AccountDecision } from '@shared/auth';
import { notFound } from '../errors';
import { parseId } from '../middleware/validate';
import { presentUser } from '../presenters/user';
import { actorFromRequest } from '../services/audit';
import { decideAccount, listPendingAccounts } from '../services/users';

export const listPending: RequestHandler = async (_req, res) => {
  const users = await listPendingAccounts();
  res.json({ accounts: users.map(presentUser) });
};

export const decide: RequestHandler = async (req, res) => {
  const id = parseId(req.params.id as string | undefined);
  if (!id) throw notFound('That account');
  const { decision } = req.body as AccountDecision;
  const user = await decideAccount(id, decision, actorFromRequest(req));
  res.json({ account: presentUser(user) });
};
