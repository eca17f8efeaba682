import type { RequestHandler } from 'express';
import type { IntakeDraftParsed, IntakeSubmitParsed } from '@shared/rider';
import { notFound } from '../errors';
import { parseId } from '../middleware/validate';
import { presentConsent, presentIntake, presentUpload } from '../presenters/intake';
import { actorFromRequest, recordAudit } from '../services/audit';
import { mayReadUpload } from '../services/access';
import { listConsents, withdrawConsent } from '../services/consents';
import { bookingReadiness } from '../services/intake-gate';
import { discardDraft, readIntake, riderIntakes, saveDraft, submitIntake } from '../services/intakes';
import { uploadsOfRider } from '../services/uploads';
import { closePhysioChatSeat } from '../services/referrals';
import type { AppContext } from '../context';

function idParam(raw: unknown, what: string): number {
  const id = parseId(typeof raw === 'string' ? raw : undefined);
  if (!id) throw notFound(what);
  return id;
}

export function createIntakesController(ctx: AppContext) {
  const current: RequestHandler = async (req, res) => {
    const { draft, submitted, consents } = await riderIntakes(req.user!.id, actorFromRequest(req));
    const present = (i: typeof draft) => (i ? presentIntake(i, i.consentId ? (consents.get(i.consentId) ?? null) : null, { forRider: true }) : null);
    res.json({ draft: present(draft), submitted: present(submitted) });
  };

  const saveDraftHandler: RequestHandler = async (req, res) => {
    const intake = await saveDraft(ctx, req.user!.id, req.body as IntakeDraftParsed, actorFromRequest(req));
    res.json({ intake: presentIntake(intake, null, { forRider: true }) });
  };

  const discard: RequestHandler = async (req, res) => {
    await discardDraft(ctx, req.user!.id, actorFromRequest(req));
    res.status(204).end();
  };

  const submit: RequestHandler = async (req, res) => {
    const { intake, consent } = await submitIntake(ctx, req.user!.id, req.body as IntakeSubmitParsed, actorFromRequest(req));
    const readiness = await bookingReadiness(req.user!.id);
    res.status(201).json({ intake: presentIntake(intake, consent, { forRider: true }), readiness });
  };

  const readiness: RequestHandler = async (req, res) => {
    res.json(await bookingReadiness(req.user!.id));
  };

  const show: RequestHandler = async (req, res) => {
    const { intake, consent } = await readIntake(req.user!, idParam(req.params.id, 'That intake'), actorFromRequest(req));
    // A referred physio sees only the files shared on their referral, as when opening a file.
    const uploads = [];
    for (const upload of await uploadsOfRider(intake.riderId)) if (await mayReadUpload(req.user!, upload)) uploads.push(upload);
    res.json({ intake: presentIntake(intake, consent, { forRider: req.user!.id === intake.riderId }), uploads: uploads.map(presentUpload) });
  };

  const consents: RequestHandler = async (req, res) => {
    await recordAudit(actorFromRequest(req), { action: 'consent.read', subjectType: 'user', subjectId: req.user!.id, subjectUserId: req.user!.id });
    res.json({ consents: (await listConsents(req.user!.id)).map(presentConsent) });
  };

  const withdraw: RequestHandler = async (req, res) => {
    const consent = await withdrawConsent(req.user!.id, idParam(req.params.id, 'That consent'), actorFromRequest(req));
    await closePhysioChatSeat(ctx, consent);
    res.json({ consent: presentConsent(consent) });
  };

  return { current, saveDraft: saveDraftHandler, discard, submit, readiness, show, consents, withdraw };
}
