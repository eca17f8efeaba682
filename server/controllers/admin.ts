import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { adminRefundSchema, auditQuerySchema, userQuerySchema, type updateUserSchema } from '@shared/admin';
import { clinicSettingsSchema } from '@shared/clinic';
import { conflict, notFound } from '../errors';
import { parseId, parseOrThrow } from '../middleware/validate';
import { Payment } from '../models';
import type { AppContext } from '../context';
import { presentUser } from '../presenters/user';
import { actorFromRequest, recordAudit } from '../services/audit';
import { HARD_BOUNDS, listPayments, listUsers, readAuditLog, saveClinicSettings, updateUser } from '../services/admin';
import { getClinicSettings } from '../services/clinic-settings';
import { refundPayment } from '../services/refunds';
import { disconnectUser } from '../socket/evict';
import { randomUUID } from 'node:crypto';
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

  const refund: RequestHandler = async (req, res) => {
    const id = parseId(req.params.id as string);
    const payment = id ? await Payment.findByPk(id) : null;
    if (!payment) throw notFound('That payment');
    const { amountMinor, reason } = parseOrThrow(adminRefundSchema, req.body);
    if (!['succeeded', 'partially_refunded'].includes(payment.status)) throw conflict('Only a completed payment can be refunded.');
    if (amountMinor > payment.amountMinor - payment.refundedMinor) throw conflict(`At most ${payment.amountMinor - payment.refundedMinor} (minor units) is left to refund.`);
    await refundPayment(ctx, payment, amountMinor, reason, `admin-${randomUUID()}`, req.user!.id);
    await recordAudit(actorFromRequest(req), { action: 'payment.refund', subjectType: 'payment', subjectId: payment.id, detail: { amountMinor } });
    await payment.reload();
    res.json({ payment: { id: payment.id, status: payment.status, amountMinor: payment.amountMinor, refundedMinor: payment.refundedMinor, currency: payment.currency } });
  };

  const audit: RequestHandler = async (req, res) => {
    res.json(await readAuditLog(parseOrThrow(auditQuerySchema, req.query)));
  };

  return { users, update, settings, saveSettings, payments, refund, audit };
}
