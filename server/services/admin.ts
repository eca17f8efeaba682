import { Op, type WhereOptions } from 'sequelize';
import { clinicSettingsSchema, type ClinicSettings as Settings } from '@shared/clinic';
import { checkPolicy, HARD_ADAPTATION_DAYS_BOUNDS, HARD_ADAPTATION_RIDES_BOUNDS, HARD_REVERT_RECENCY_BOUNDS, HARD_STEP_CAP_BOUNDS, HARD_WINDOW_CAP_BOUNDS, HARD_WINDOW_DAYS_BOUNDS } from '@shared/fit/planner';
import type { Role } from '@shared/auth';
import { badRequest, conflict, notFound } from '../errors';
import { AuditEntry, ClinicSettings, Consultation, Payment, Session, User } from '../models';
import { recordAudit, type AuditActor } from './audit';

const PAGE_SIZE = 25;

export async function listUsers(query: { role?: Role; status?: User['status']; q?: string; page: number }) {
  const where: WhereOptions<User> = {
    ...(query.role ? { role: query.role } : {}),
    ...(query.status ? { status: query.status } : {}),
    ...(query.q ? { [Op.or]: [{ email: { [Op.substring]: query.q } }, { displayName: { [Op.substring]: query.q } }] } : {}),
  };
  const { rows, count } = await User.findAndCountAll({ where, order: [['id', 'ASC']], limit: PAGE_SIZE, offset: (query.page - 1) * PAGE_SIZE });
  return { users: rows, total: count, page: query.page, pageSize: PAGE_SIZE };
}

/**
 * Change a role or switch an account off. An admin cannot lock themself out, and the clinic keeps
 * at least one active admin. Switching an account off ends its sessions at once.
 */
export async function updateUser(admin: Express.User, userId: number, change: { role?: Role; status?: 'active' | 'disabled' }, actor: AuditActor) {
  const user = await User.findByPk(userId);
  if (!user) throw notFound('That account');
  if (user.id === admin.id && (change.status === 'disabled' || (change.role && change.role !== 'admin'))) {
    throw conflict('You cannot switch off or demote your own account. Ask another admin.');
  }
  const losingAdmin = user.role === 'admin' && user.status === 'active' && ((change.role && change.role !== 'admin') || change.status === 'disabled');
  if (losingAdmin && (await User.count({ where: { role: 'admin', status: 'active' } })) <= 1) throw conflict('The clinic needs at least one active admin.');
  if (user.status === 'pending' || user.status === 'rejected') throw conflict('Approve or reject this account on the Approvals tab first.');
  await user.update({ ...(change.role ? { role: change.role } : {}), ...(change.status ? { status: change.status } : {}) });
  if (change.status === 'disabled' || change.role) await Session.destroy({ where: { userId: user.id } });
  await recordAudit(actor, { action: 'user.update', subjectType: 'user', subjectId: user.id, detail: change });
  return user;
}

export const HARD_BOUNDS = {
  stepCaps: HARD_STEP_CAP_BOUNDS,
  windowCaps: HARD_WINDOW_CAP_BOUNDS,
  windowDays: HARD_WINDOW_DAYS_BOUNDS,
  adaptationDays: HARD_ADAPTATION_DAYS_BOUNDS,
  adaptationRides: HARD_ADAPTATION_RIDES_BOUNDS,
  revertRecencyDays: HARD_REVERT_RECENCY_BOUNDS,
};

/** Save the clinic policy; planner values outside the hard safety bounds are refused, never clamped silently. */
export async function saveClinicSettings(admin: Express.User, input: Settings, actor: AuditActor) {
  const settings = clinicSettingsSchema.parse(input);
  const issues = checkPolicy(settings.planner);
  if (issues.length > 0) {
    throw badRequest(`Some limits are outside the safety bounds: ${issues.map((i) => i.message).join(' ')}`, Object.fromEntries(issues.map((i) => [`planner.${i.field}`, `Allowed ${i.min}–${i.max}.`])));
  }
  await ClinicSettings.upsert({ id: 1, settings, updatedById: admin.id, updatedAt: new Date() });
  await recordAudit(actor, { action: 'clinic.settings', subjectType: 'clinic', subjectId: 1 });
  return settings;
}

export async function listPayments(page: number) {
  const { rows, count } = await Payment.findAndCountAll({ order: [['id', 'DESC']], limit: PAGE_SIZE, offset: (page - 1) * PAGE_SIZE });
  const consultations = await Consultation.findAll({ where: { id: { [Op.in]: rows.map((p) => p.consultationId) } }, attributes: ['id', 'riderId', 'fitterId'] });
  const byConsultation = new Map(consultations.map((c) => [c.id, c]));
  const userIds = [...new Set(consultations.flatMap((c) => [c.riderId, c.fitterId]))];
  const users = userIds.length ? await User.findAll({ where: { id: { [Op.in]: userIds } }, attributes: ['id', 'displayName'] }) : [];
  const names = new Map(users.map((u) => [u.id, u.displayName]));
  return {
    payments: rows.map((p) => {
      const c = byConsultation.get(p.consultationId);
      return {
        id: p.id,
        consultationId: p.consultationId,
        // A deleted rider's payment stays for the accounts, without the person.
        riderName: p.riderId ? (names.get(p.riderId) ?? 'Deleted rider') : 'Deleted rider',
        fitterName: c ? (names.get(c.fitterId) ?? '') : '',
        amountMinor: p.amountMinor,
        refundedMinor: p.refundedMinor,
        currency: p.currency,
        status: p.status,
        stripeChargeId: p.stripeChargeId,
        createdAt: p.createdAt.toISOString(),
      };
    }),
    total: count,
    page,
    pageSize: PAGE_SIZE,
  };
}

/** The access log, newest first, paged by id. Read-only: the table refuses updates and deletes. */
export async function readAuditLog(query: { actorId?: number; subjectUserId?: number; action?: string; beforeId?: number; limit: number }) {
  const rows = await AuditEntry.findAll({
    where: {
      ...(query.actorId ? { actorId: query.actorId } : {}),
      ...(query.subjectUserId ? { subjectUserId: query.subjectUserId } : {}),
      ...(query.action ? { action: { [Op.startsWith]: query.action } } : {}),
      ...(query.beforeId ? { id: { [Op.lt]: query.beforeId } } : {}),
    },
    order: [['id', 'DESC']],
    limit: query.limit + 1,
  });
  const page = rows.slice(0, query.limit);
  const ids = [...new Set(page.flatMap((r) => [r.actorId, r.subjectUserId]).filter((id): id is number => id !== null))];
  const users = ids.length ? await User.findAll({ where: { id: { [Op.in]: ids } }, attributes: ['id', 'displayName'] }) : [];
  const names = new Map(users.map((u) => [u.id, u.displayName]));
  return {
    entries: page.map((r) => ({
      id: Number(r.id),
      createdAt: r.createdAt.toISOString(),
      actorId: r.actorId,
      actorName: r.actorId ? (names.get(r.actorId) ?? null) : null,
      actorRole: r.actorRole,
      action: r.action,
      subjectType: r.subjectType,
      subjectId: r.subjectId,
      subjectUserId: r.subjectUserId,
      subjectUserName: r.subjectUserId ? (names.get(r.subjectUserId) ?? null) : null,
      ip: r.ip,
      userAgent: r.userAgent,
    })),
    nextBeforeId: rows.length > query.limit ? Number(page[page.length - 1]!.id) : null,
  };
}
