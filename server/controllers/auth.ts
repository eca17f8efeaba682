import type { Request, RequestHandler, Response } from 'express';
import type { RegisterInput } from '@shared/auth';
import { accountDisabled, accountPending, notSignedIn, signInFailed } from '../errors';
import type { AppPassport, SignInRefusal } from '../auth/passport';
import { actorFromRequest, recordAudit } from '../services/audit';
import { registerUser } from '../services/users';
import type { PasswordHasher } from '../services/passwords';
import { presentUser } from '../presenters/user';
import type { User } from '../models';
import type { AppContext } from '../context';
import { sendWelcome } from '../mail/account-mails';
import { endSessionSockets } from '../socket/evict';

interface AuthControllerDeps {
  passport: AppPassport;
  hasher: PasswordHasher;
  generateCsrfToken: (req: Request, overwrite?: boolean) => string;
  ctx: AppContext;
}

/** req.login regenerates the session id (passport ≥ 0.6), so a fixated id is useless. */
function logIn(req: Request, user: User): Promise<void> {
  return new Promise((resolve, reject) => req.logIn(user, (error) => (error ? reject(error) : resolve())));
}

function authenticate(passport: AppPassport, req: Request, res: Response): Promise<{ user: User | false; refusal?: SignInRefusal }> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', (error: unknown, user: User | false, info?: { message?: string }) => {
      if (error) return reject(error);
      resolve({ user, refusal: info?.message as SignInRefusal | undefined });
    })(req, res);
  });
}

export function createAuthController({ passport, hasher, generateCsrfToken, ctx }: AuthControllerDeps) {
  const csrf: RequestHandler = (req, res) => {
    res.json({ csrfToken: generateCsrfToken(req) });
  };

  const register: RequestHandler = async (req, res) => {
    const input = req.body as RegisterInput;
    const user = await registerUser(input, hasher, actorFromRequest(req));
    // A mail outage must not undo a registration; it is logged instead.
    await sendWelcome(ctx, user).catch((error: unknown) => ctx.logger.error({ err: error }, 'welcome e-mail failed'));
    if (user.status !== 'active') {
      res.status(201).json({ user: presentUser(user), signedIn: false, message: 'Thanks. The clinic will review your account; we will e-mail you when you can sign in.' });
      return;
    }
    await logIn(req, user);
    res.status(201).json({ user: presentUser(user), signedIn: true, csrfToken: generateCsrfToken(req, true) });
  };

  const signIn: RequestHandler = async (req, res) => {
    const { user, refusal } = await authenticate(passport, req, res);
    if (!user) {
      await recordAudit(actorFromRequest(req), { action: 'auth.sign_in_failed' });
      if (refusal === 'pending') throw accountPending();
      if (refusal === 'disabled') throw accountDisabled();
      throw signInFailed();
    }
    await logIn(req, user);
    user.lastSignInAt = new Date();
    await user.save({ fields: ['lastSignInAt'] });
    await recordAudit(actorFromRequest(req), { action: 'auth.sign_in', subjectType: 'user', subjectId: user.id });
    res.json({ user: presentUser(user), csrfToken: generateCsrfToken(req, true) });
  };

  const signOut: RequestHandler = async (req, res) => {
    const actor = actorFromRequest(req);
    // Read before logOut, which regenerates the session: this id is the one the tab's sockets carry.
    const sessionId = req.sessionID;
    await new Promise<void>((resolve, reject) => req.logOut((error) => (error ? reject(error) : resolve())));
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    endSessionSockets(ctx.io, sessionId);
    if (actor.actorId) await recordAudit(actor, { action: 'auth.sign_out' });
    res.clearCookie('saddlestep.sid');
    res.status(204).end();
  };

  const me: RequestHandler = (req, res) => {
    if (!req.user) throw notSignedIn();
    res.json({ user: presentUser(req.user) });
  };

  return { csrf, register, signIn, signOut, me };
}
