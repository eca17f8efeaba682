import type { CheckInDecision } from '@shared/fit/checkin';
import type { AppContext } from '../context';
import { Plan, User } from '../models';
import { renderMail } from '../mail/layout';
import { publicUrl } from '../mail/booking-mails';
import { userRoom } from '../socket/rooms';

const HEADLINES: Record<Exclude<CheckInDecision, 'continue'>, string> = {
  'hold-for-review': 'asks for your review',
  'suggest-revert': 'is worse: going back a step is suggested',
  refer: 'suggests a physiotherapist should look at this',
};

/** Tell the fitter (socket now, e-mail always) that a check-in needs them. No health details in the mail. */
export async function alertFitter(ctx: AppContext, plan: Pick<Plan, 'fitterId' | 'riderId' | 'consultationId'>, decision: Exclude<CheckInDecision, 'continue'> | CheckInDecision, urgent: boolean) {
  if (decision === 'continue') return;
  const [fitter, rider] = await Promise.all([User.findByPk(plan.fitterId), User.findByPk(plan.riderId)]);
  if (!fitter || !rider) return;
  const headline = urgent ? 'reported urgent warning signs: the plan is paused' : HEADLINES[decision];
  ctx.io?.to(userRoom(fitter.id)).emit('care:alert', { kind: urgent ? 'checkin-urgent' : `checkin-${decision}`, consultationId: plan.consultationId, message: `${rider.displayName}'s check-in ${headline}.` });
  const mail = renderMail({
    subject: `${urgent ? 'Urgent: ' : ''}${rider.displayName}'s check-in ${headline}`,
    paragraphs: [`Hello ${fitter.displayName},`, `A check-in from ${rider.displayName} needs your attention. Open the session room to see it.`],
    action: { label: 'Open the session room', url: `${publicUrl(ctx)}/consultations/${plan.consultationId}/room` },
  });
  await ctx.mailer.send({ to: fitter.email, ...mail }).catch((error: unknown) => ctx.logger.error({ err: error }, 'alert e-mail failed'));
}
