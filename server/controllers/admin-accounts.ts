import type { RequestHandler } from 'express';
import type { AccountDecision } from '@shared/auth';
import { notFound } from '../errors';
import { parseId } from '../middleware/validate';
import { presentUser } from '../presenters/user';
import { actorFromRequest } from '../services/audit';
import { decideAccount, listPendingAccounts } from '../services/users';
import { sendAccountDecision } from '../mail/account-mails';
import type { AppContext } from '../context';

export function createAdminAccountsController(ctx: AppContext) {
  const listPending: RequestHandler = async (_req, res) => {
    const users = await listPendingAccounts();
    res.json({ accounts: users.map(presentUser) });
  };

  /** Approve or reject, then tell the person by e-mail (as the registration page promised). */
  const decide: RequestHandler = async (req, res) => {
    const id = parseId(req.params.id as string | undefined);
    if (!id) throw notFound('That account');
    const { decision } = req.body as AccountDecision;
    const user = await decideAccount(id, decision, actorFromRequest(req));
    await sendAccountDecision(ctx, user).catch((error: unknown) => ctx.logger.error({ err: error }, 'decision e-mail failed'));
    res.json({ account: presentUser(user) });
  };

  return { listPending, decide };
}
