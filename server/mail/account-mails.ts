import type { AppContext } from '../context';
import type { User } from '../models';
import { publicUrl } from './booking-mails';
import { renderMail } from './layout';

/** Welcome on registration; pending staff hear that the clinic will review them. */
export async function sendWelcome(ctx: AppContext, user: User) {
  const pending = user.status === 'pending';
  const mail = renderMail({
    subject: 'Welcome to Saddlestep',
    paragraphs: [
      `Hello ${user.displayName},`,
      pending
        ? 'Thanks for signing up. The clinic reviews new fitters and physiotherapists; we will e-mail you when you can sign in.'
        : 'Your account is ready. Start by telling us what hurts and recording your bike as it is today, so any change can be undone.',
    ],
    action: { label: 'Open Saddlestep', url: `${publicUrl(ctx)}/sign-in` },
  });
  await ctx.mailer.send({ to: user.email, ...mail });
}

/** The outcome of an admin's review of a pending fitter or physio. */
export async function sendAccountDecision(ctx: AppContext, user: User) {
  const approved = user.status === 'active';
  const mail = renderMail({
    subject: approved ? 'Your Saddlestep account is ready' : 'About your Saddlestep application',
    paragraphs: [
      `Hello ${user.displayName},`,
      approved
        ? 'The clinic has approved your account. You can sign in now.'
        : 'The clinic has not approved your account. If you think this is a mistake, please contact the studio.',
    ],
    ...(approved ? { action: { label: 'Sign in', url: `${publicUrl(ctx)}/sign-in` } } : {}),
  });
  await ctx.mailer.send({ to: user.email, ...mail });
}
