import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { auditQuerySchema, userQuerySchema, type updateUserSchema } from '@shared/admin';
import { adminRefundRequestSchema } from '@shared/booking';
import { clinicSettingsSchema } from '@shared/clinic';
import { notFound } from '../errors';
import { parseId, parseOrThrow } from '../middleware/validate';
import type { AppContext } from '../context';
import { presentUser } from '../presenters/user';
import { actorFromRequest } from '../services/audit';
import { HARD_BOUNDS, listPayments, listUsers, readAuditLog, saveClinicSettings, updateUser } from '../services/admin';
import { getClinicSettings } from '../services/clinic-settings';
import { refundByAdmin } from '../services/refunds';
import { disconnectUser } from '../socket/evict';
import { z as zod } from 'zod';

/** PUT /api/admin/settings wraps the settings so the body can grow without ambiguity. */
const clinicSettingsBody = zod.strictObject({ settings: clinicSettingsSchema });

export function createAdminController(ctx: AppContext) {
  const users: RequestHandler = async (req, res) => {
    const result = await listUsers(parseOrThrow(userQuerySchema, req.query));
    res.json({ ...result, users: result.users.map(presentUser) });
  };

  const update: RequestHandler = async (req, res) => {
    const id = parseId(req.params.id as string);
    if (!id) throw notFound('That account');
    const change = req.body as z.output<typeof updateUserSchema>;
    const user = await updateUser(req.user!, id, change, actorFromRequest(req));
    // updateUser ended the sessions; open sockets must not outlive them.
    if (change.status === 'disabled' || change.role) disconnectUser(ctx.io, user.id);
    res.json({ user: presentUser(user) });
  };

  const settings: RequestHandler = async (_req, res) => {
    res.json({ settings: await getClinicSettings(), hardBounds: HARD_BOUNDS });
  };

  const saveSettings: RequestHandler = async (req, res) => {
    const { settings: input } = parseOrThrow(clinicSettingsBody, req.body);
    res.json({ settings: await saveClinicSettings(req.user!, input, actorFromRequest(req)) });
  };

  const payments: RequestHandler = async (req, res) => {
    const page = Math.max(1, Math.min(10_000, Number(req.query.page ?? 1) || 1));
    res.json(await listPayments(page));
  };

  /** The service locks the payment, counts what is left and keys the refund by the client's attempt id. */
  const refund: RequestHandler = async (req, res) => {
    const id = parseId(req.params.id as string);
    if (!id) throw notFound('That payment');
    const input = parseOrThrow(adminRefundRequestSchema, req.body);
    const { payment, refund: made } = await refundByAdmin(ctx, id, input, actorFromRequest(req));
    res.json({
      payment: { id: payment.id, status: payment.status, amountMinor: payment.amountMinor, refundedMinor: payment.refundedMinor, currency: payment.currency },
      refund: { id: made.id, status: made.status, amountMinor: made.amountMinor },
    });
  };

  const audit: RequestHandler = async (req, res) => {
    res.json(await readAuditLog(parseOrThrow(auditQuerySchema, req.query)));
  };

  return { users, update, settings, saveSettings, payments, refund, audit };
}
