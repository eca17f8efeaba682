import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { Op } from 'sequelize';
import { planInputsQuerySchema, type applyStepSchema, type noteSchema, type revertSchema, type saveMeasurementSchema, type sendPlanSchema } from '@shared/plan';
import { photoMeasurementInputSchema } from '@shared/fit/photo';
import { mayStartSession, START_EARLY_MINUTES } from '@shared/consultation';
import { conflict, notFound } from '../errors';
import { parseId, parseOrThrow } from '../middleware/validate';
import { Consultation, Plan, PlanStep, User } from '../models';
import type { AppContext } from '../context';
import { presentPlan } from '../presenters/plan';
import { actorFromRequest, recordAudit } from '../services/audit';
import { addNote, assignedConsultation, caseFile, listNotes } from '../services/case-file';
import { buildPlanInputs } from '../services/plan-inputs';
import { applyStep, findVisiblePlan, revertToSnapshot, sendPlan } from '../services/plans';
import { listMeasurements, presentMeasurement, saveMeasurement } from '../services/measurements';
import { followUpsFor } from '../services/follow-ups';
import { transitionConsultation } from '../services/consultation-states';
import { presentConsultation } from '../presenters/consultation';
import { z as zod } from 'zod';

function idParam(raw: unknown, what: string): number {
  const id = parseId(raw as string);
  if (!id) throw notFound(what);
  return id;
}

async function withSteps(plan: Plan) {
  const [steps, fitter] = await Promise.all([PlanStep.findAll({ where: { planId: plan.id } }), User.findByPk(plan.fitterId)]);
  return presentPlan(plan, steps, fitter);
}

export function createPlanController(ctx: AppContext) {
  const start: RequestHandler = async (req, res) => {
    const consultation = await assignedConsultation(req.user!, idParam(req.params.id, 'That consultation'));
    await ctx.sequelize.transaction(async (transaction) => {
      await consultation.reload({ transaction, lock: transaction.LOCK.UPDATE });
      if (consultation.status === 'booked' && !mayStartSession(consultation.startsAt, new Date())) {
        throw conflict(`This session can be started from ${START_EARLY_MINUTES} minutes before its booked time. Until then the rider can still move or cancel it.`);
      }
      await transitionConsultation(ctx, consultation, 'in_session', { actorId: req.user!.id, note: 'session started', transaction });
    });
    res.json({ consultation: presentConsultation(consultation, {}) });
  };

  const caseView: RequestHandler = async (req, res) => {
    res.json(await caseFile(req.user!, idParam(req.params.id, 'That consultation'), actorFromRequest(req)));
  };

  const planInputs: RequestHandler = async (req, res) => {
    const consultation = await assignedConsultation(req.user!, idParam(req.params.id, 'That consultation'));
    const { bikeId } = parseOrThrow(planInputsQuerySchema, req.query);
    const { inputs } = await buildPlanInputs(consultation, bikeId);
    await recordAudit(actorFromRequest(req), { action: 'plan.inputs_read', subjectType: 'consultation', subjectId: consultation.id, subjectUserId: consultation.riderId });
    res.json({ bikeId, ...inputs, physio: inputs.physio ?? null });
  };

  const create: RequestHandler = async (req, res) => {
    const body = req.body as z.output<typeof sendPlanSchema>;
    const plan = await sendPlan(ctx, req.user!, idParam(req.params.id, 'That consultation'), body, actorFromRequest(req));
    res.status(201).json({ plan: await withSteps(plan) });
  };

  const listForConsultation: RequestHandler = async (req, res) => {
    const id = idParam(req.params.id, 'That consultation');
    const user = req.user!;
    const consultation = await Consultation.findOne({ where: { id, [Op.or]: [{ riderId: user.id }, { fitterId: user.id }] } });
    if (!consultation) throw notFound('That consultation');
    const plans = await Plan.findAll({ where: { consultationId: id }, order: [['id', 'DESC']] });
    if (plans.length) await recordAudit(actorFromRequest(req), { action: 'plan.read', subjectType: 'consultation', subjectId: id, subjectUserId: plans[0]!.riderId });
    res.json({ plans: await Promise.all(plans.map(withSteps)) });
  };

  const show: RequestHandler = async (req, res) => {
    const plan = await findVisiblePlan(req.user!, idParam(req.params.planId, 'That plan'));
    await recordAudit(actorFromRequest(req), { action: 'plan.read', subjectType: 'plan', subjectId: plan.id, subjectUserId: plan.riderId });
    res.json({ plan: await withSteps(plan) });
  };

  const current: RequestHandler = async (req, res) => {
    const plan = await Plan.findOne({ where: { riderId: req.user!.id, status: { [Op.in]: ['active', 'on_hold'] } }, order: [['id', 'DESC']] });
    if (plan) await recordAudit(actorFromRequest(req), { action: 'plan.read', subjectType: 'plan', subjectId: plan.id, subjectUserId: plan.riderId });
    res.json({ plan: plan ? await withSteps(plan) : null });
  };

  const apply: RequestHandler = async (req, res) => {
    const { appliedOn } = req.body as z.output<typeof applyStepSchema>;
    const plan = await applyStep(ctx, req.user!, idParam(req.params.planId, 'That plan'), idParam(req.params.index, 'That step'), appliedOn, actorFromRequest(req));
    res.json({ plan: await withSteps(plan) });
  };

  const revert: RequestHandler = async (req, res) => {
    const { snapshotId } = req.body as z.output<typeof revertSchema>;
    const plan = await revertToSnapshot(ctx, req.user!, idParam(req.params.bikeId, 'That bike'), snapshotId, actorFromRequest(req));
    res.status(201).json({ plan: await withSteps(plan) });
  };

  const notes: RequestHandler = async (req, res) => {
    const rows = await listNotes(req.user!, idParam(req.params.id, 'That consultation'), actorFromRequest(req));
    res.json({ notes: rows.map((n) => ({ id: n.id, body: n.body, createdAt: n.createdAt.toISOString(), updatedAt: n.updatedAt.toISOString() })) });
  };

  const createNote: RequestHandler = async (req, res) => {
    const { body } = req.body as z.output<typeof noteSchema>;
    const note = await addNote(req.user!, idParam(req.params.id, 'That consultation'), body, actorFromRequest(req));
    res.status(201).json({ note: { id: note.id, body: note.body, createdAt: note.createdAt.toISOString(), updatedAt: note.updatedAt.toISOString() } });
  };

  const measure: RequestHandler = async (req, res) => {
    const { consultationId, input } = req.body as z.output<typeof saveMeasurementSchema>;
    const measurement = await saveMeasurement(req.user!, idParam(req.params.uploadId, 'That photo'), consultationId, photoMeasurementInputSchema.parse(input), actorFromRequest(req));
    res.status(201).json({ measurement: presentMeasurement(measurement) });
  };

  const measurements: RequestHandler = async (req, res) => {
    const { consultationId } = parseOrThrow(zod.strictObject({ consultationId: zod.coerce.number().int().positive().max(4_294_967_295) }), req.query);
    const rows = await listMeasurements(req.user!, idParam(req.params.uploadId, 'That photo'), consultationId, actorFromRequest(req));
    res.json({ measurements: rows.map(presentMeasurement) });
  };

  const followUps: RequestHandler = async (req, res) => {
    const list = await followUpsFor(req.user!);
    // The list shows who is getting worse and why: one read row per rider in it.
    const riderIds = new Set([...list.due, ...list.overdue, ...list.gettingWorse, ...list.referralsWaiting].map((item) => item.riderId));
    const actor = actorFromRequest(req);
    for (const riderId of riderIds) await recordAudit(actor, { action: 'followup.read', subjectType: 'user', subjectId: riderId, subjectUserId: riderId });
    res.json(list);
  };

  return { start, caseView, planInputs, create, listForConsultation, show, current, apply, revert, notes, createNote, measure, measurements, followUps };
}
