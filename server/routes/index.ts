import { Router, type RequestHandler } from 'express';
import { accountDecisionSchema, accountSettingsSchema, registerSchema, signInSchema } from '@shared/auth';
import { validateBody } from '../middleware/validate';
import { requireRole, requireSignedIn } from '../middleware/require-role';
import { apiNotFound } from '../middleware/error-handler';
import type { createAuthController } from '../controllers/auth';
import * as homes from '../controllers/homes';
import { updateAccount } from '../controllers/account';
import { createAdminAccountsController } from '../controllers/admin-accounts';
import type { AppContext } from '../context';
import { createRiderJourneyRouter } from './rider-journey';
import { createBookingRouter } from './booking';
import { createConsultationRoomRouter } from './consultation-room';
import { createCareRouter } from './care';
import { createAdminRouter } from './admin';
import type { PasswordHasher } from '../services/passwords';

interface RouteDeps {
  auth: ReturnType<typeof createAuthController>;
  authRateLimit: RequestHandler;
  health: RequestHandler;
  hasher: PasswordHasher;
}

/**
 * Every API route, in one place. Each guarded route names its roles here, so a reader (and the
 * role-matrix test) can see the whole access policy at a glance.
 */
export function createApiRouter(ctx: AppContext, { auth, authRateLimit, health, hasher }: RouteDeps): Router {
  const api = Router();

  const adminAccounts = createAdminAccountsController(ctx);

  api.get('/health', health);

  api.get('/auth/csrf', auth.csrf);
  api.post('/auth/register', authRateLimit, validateBody(registerSchema), auth.register);
  api.post('/auth/sign-in', authRateLimit, validateBody(signInSchema), auth.signIn);
  api.post('/auth/sign-out', requireSignedIn, auth.signOut);
  api.get('/auth/me', requireSignedIn, auth.me);
  api.patch('/auth/me', requireSignedIn, validateBody(accountSettingsSchema), updateAccount);

  api.get('/rider/home', requireRole('rider'), homes.riderHome);
  api.get('/admin/home', requireRole('admin'), homes.adminHome);
  api.get('/admin/accounts/pending', requireRole('admin'), adminAccounts.listPending);
  api.post('/admin/accounts/:id/decision', requireRole('admin'), validateBody(accountDecisionSchema), adminAccounts.decide);

  // Feature routers (one file each in server/routes/) are mounted here, before the 404.
  api.use(createRiderJourneyRouter(ctx));
  api.use(createBookingRouter(ctx));
  api.use(createConsultationRoomRouter(ctx));
  api.use(createCareRouter(ctx));
  api.use(createAdminRouter(ctx, hasher));

  api.use(apiNotFound);
  return api;
}

