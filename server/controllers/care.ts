import type { RequestHandler } from 'express';
import type { z } from 'zod';
import type { checkInFormSchema, clearHoldSchema, createReferralSchema, declineReferralSchema, physioResponseSchema, referralConsentSchema } from '@shared/care';
import { notFound } from '../errors';
import { parseId } from '../middleware/validate';
import { Consultation, Plan, PlanStep, Referral, User } from '../models';
import type { AppContext } from '../context';
import { presentCheckIn, withoutClinicalText } from '../presenters/care';
import { presentPlan } from '../presenters/plan';
import { actorFromRequest, recordAudit } from '../services/audit';
import { reviewCheckIn, submitCheckIn } from '../services/check-ins';
import { presentReferrals, trendFor } from '../services/care-views';
import { mayReadHealthData } from '../services/access';
import { revertStep } from '../services/plans';
import { confirmProposal, consentToReferral, createReferral, referralsOfConsultation } from '../services/referrals';
import { acceptReferral, clearHold, declineReferral, physioInbox, receiveReferral, respondToReferral, startReferral } from '../services/physio';
import { physioCase } from '../services/physio-case';

function id(raw: unknown, what: string): number {
  const parsed = parseId(raw as string);
  if (!parsed) throw notFound(what);
  return parsed;
}

async function planView(plan: Plan) {
  return presentPlan(plan, await PlanStep.findAll({ where: { planId: plan.id } }), await User.findByPk(plan.fitterId));
}

export function createCareController(ctx: AppContext) {
  const checkIn: RequestHandler = async (req, res) => {
    const form = req.body as z.output<typeof checkInFormSchema>;
    const planId = id(req.params.planId, 'That plan');
    const result = await submitCheckIn(ctx, req.user!, planId, id(req.params.index, 'That step'), form, actorFromRequest(req));
    const plan = (await Plan.findByPk(planId))!;
    res.status(201).json({ checkIn: presentCheckIn(result.checkIn), plan: await planView(plan), outcome: result.outcome });
  };

  const undoStep: RequestHandler = async (req, res) => {
    const plan = await revertStep(ctx, req.user!, id(req.params.planId, 'That plan'), id(req.params.index, 'That step'), actorFromRequest(req));
    res.status(201).json({ plan: await planView(plan) });
  };

  const ownTrend: RequestHandler = async (req, res) => {
    await recordAudit(actorFromRequest(req), { action: 'checkin.read', subjectType: 'user', subjectId: req.user!.id, subjectUserId: req.user!.id });
    res.json(await trendFor(req.user!.id));
  };

  const consultationTrend: RequestHandler = async (req, res) => {
    const consultation = await Consultation.findByPk(id(req.params.id, 'That consultation'));
    const user = req.user!;
    const allowed = consultation && (user.role === 'fitter' ? consultation.fitterId === user.id : await mayReadHealthData(user, consultation.riderId));
    if (!consultation || !allowed) throw notFound('That consultation');
    await recordAudit(actorFromRequest(req), { action: 'checkin.read', subjectType: 'consultation', subjectId: consultation.id, subjectUserId: consultation.riderId });
    res.json(await trendFor(consultation.riderId, consultation.id));
  };

  const review: RequestHandler = async (req, res) => {
    const checkIn = await reviewCheckIn(req.user!, id(req.params.id, 'That check-in'), actorFromRequest(req));
    res.json({ checkIn: presentCheckIn(checkIn) });
  };

  const physios: RequestHandler = async (_req, res) => {
    const rows = await User.findAll({ where: { role: 'physio', status: 'active' }, attributes: ['id', 'displayName'], order: [['displayName', 'ASC']] });
    res.json({ physios: rows.map((p) => ({ id: p.id, displayName: p.displayName })) });
  };

  const refer: RequestHandler = async (req, res) => {
    const input = req.body as z.output<typeof createReferralSchema>;
    const referral = await createReferral(ctx, req.user!, id(req.params.id, 'That consultation'), input, actorFromRequest(req));
    res.status(201).json({ referral: (await presentReferrals([referral]))[0] });
  };

  const confirm: RequestHandler = async (req, res) => {
    const input = req.body as z.output<typeof createReferralSchema>;
    const referral = await confirmProposal(ctx, req.user!, id(req.params.id, 'That referral'), input, actorFromRequest(req));
    res.json({ referral: (await presentReferrals([referral]))[0] });
  };

  const consultationReferrals: RequestHandler = async (req, res) => {
    const consultationId = id(req.params.id, 'That consultation');
    const rows = await referralsOfConsultation(req.user!, consultationId);
    if (rows.length) await recordAudit(actorFromRequest(req), { action: 'referral.read', subjectType: 'consultation', subjectId: consultationId, subjectUserId: rows[0]!.riderId });
    res.json({ referrals: await presentReferrals(rows) });
  };

  const riderReferrals: RequestHandler = async (req, res) => {
    const rows = await Referral.findAll({ where: { riderId: req.user!.id }, order: [['id', 'DESC']] });
    await recordAudit(actorFromRequest(req), { action: 'referral.read', subjectType: 'user', subjectId: req.user!.id, subjectUserId: req.user!.id });
    // A proposal the fitter has not confirmed is not the rider's to act on yet.
    res.json({ referrals: await presentReferrals(rows.filter((r) => r.status !== 'proposed')) });
  };

  const consent: RequestHandler = async (req, res) => {
    const { version } = req.body as z.output<typeof referralConsentSchema>;
    const referral = await consentToReferral(ctx, req.user!, id(req.params.id, 'That referral'), version, actorFromRequest(req));
    res.json({ referral: (await presentReferrals([referral]))[0] });
  };

  const inbox: RequestHandler = async (req, res) => {
    const rows = await physioInbox(req.user!);
    // Each listed referral shows reasons and findings (one read row per rider's referral), except
    // those this physio declined, which show no health details and so are not a read.
    const actor = actorFromRequest(req);
    for (const row of rows) {
      if (row.status !== 'declined') await recordAudit(actor, { action: 'referral.read', subjectType: 'referral', subjectId: row.id, subjectUserId: row.riderId });
    }
    const presented = await presentReferrals(rows);
    res.json({ referrals: presented.map((r) => (r.status === 'declined' ? withoutClinicalText(r) : r)) });
  };

  const physioAction = (action: 'receive' | 'accept' | 'start'): RequestHandler => async (req, res) => {
    const run = { receive: receiveReferral, accept: acceptReferral, start: startReferral }[action];
    const referral = await run(ctx, req.user!, id(req.params.id, 'That referral'), actorFromRequest(req));
    res.json({ referral: (await presentReferrals([referral]))[0] });
  };

  const decline: RequestHandler = async (req, res) => {
    const { note } = req.body as z.output<typeof declineReferralSchema>;
    const referral = await declineReferral(ctx, req.user!, id(req.params.id, 'That referral'), note, actorFromRequest(req));
    res.json({ referral: withoutClinicalText((await presentReferrals([referral]))[0]!) });
  };

  const respond: RequestHandler = async (req, res) => {
    const input = req.body as z.output<typeof physioResponseSchema>;
    const referral = await respondToReferral(ctx, req.user!, id(req.params.id, 'That referral'), input, actorFromRequest(req));
    res.json({ referral: (await presentReferrals([referral]))[0] });
  };

  const release: RequestHandler = async (req, res) => {
    const { note } = req.body as z.output<typeof clearHoldSchema>;
    const referral = await clearHold(ctx, req.user!, id(req.params.id, 'That referral'), note, actorFromRequest(req));
    res.json({ referral: (await presentReferrals([referral]))[0] });
  };

  const caseView: RequestHandler = async (req, res) => {
    res.json(await physioCase(req.user!, id(req.params.id, 'That referral'), actorFromRequest(req)));
  };

  return { checkIn, undoStep, ownTrend, consultationTrend, review, physios, refer, confirm, consultationReferrals, riderReferrals, consent, inbox, physioAction, decline, respond, release, caseView };
}
