import { Router } from 'express';
import { deleteAccountSchema, refundRetrySchema, updateUserSchema } from '@shared/admin';
import { requireRole } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { AppContext } from '../context';
import type { PasswordHasher } from '../services/passwords';
import { createAdminController } from '../controllers/admin';
import { createAdminRefundsController } from '../controllers/admin-refunds';
import { createPrivacyController } from '../controllers/privacy';

/** The clinic's admin pages, and the rider's own export and deletion. */
export function createAdminRouter(ctx: AppContext, hasher: PasswordHasher): Router {
  const router = Router();
  const admin = createAdminController(ctx);
  const refunds = createAdminRefundsController(ctx);
  const privacy = createPrivacyController(ctx, hasher);
  const isAdmin = requireRole('admin');

  router.get('/admin/users', isAdmin, admin.users);
  router.patch('/admin/users/:id', isAdmin, validateBody(updateUserSchema), admin.update);
  router.get('/admin/settings', isAdmin, admin.settings);
  router.put('/admin/settings', isAdmin, admin.saveSettings);
  router.get('/admin/payments', isAdmin, admin.payments);
  router.post('/admin/payments/:id/refund', isAdmin, admin.refund);
  router.get('/admin/refunds/attention', isAdmin, refunds.attention);
  router.post('/admin/refunds/:id/retry', isAdmin, validateBody(refundRetrySchema), refunds.retry);
  router.get('/admin/audit', isAdmin, admin.audit);

  router.get('/rider/export', requireRole('rider'), privacy.exportData);
  router.delete('/rider/account', requireRole('rider'), validateBody(deleteAccountSchema), privacy.deleteAccount);
  return router;
}
