import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { Sequelize } from 'sequelize';
import { Consultation, Payment, Refund, ScheduledJob } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { startTestApp } from '../support/app';
import { buildFitter, riderReadyToBook } from '../support/booking-factories';
import { attachmentText, mailsTo, waitForMails } from '../support/mail';
import { signedInAs } from '../support/factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

/** A paid booking `hoursAhead` from now (rounded up to the next whole hour slot). */
async function paidBooking(hoursAhead: number) {
  const { fitter } = await buildFitter({ availability: { windows: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '00:00', end: '24:00' })), exceptions: [], slotMinutes: 60, bufferMinutes: 0, minNoticeHours: 0, horizonDays: 30 } });
  const rider = await riderReadyToBook(saddlestep.app);
  const target = new Date(Math.ceil((Date.now() + hoursAhead * 3_600_000) / 3_600_000) * 3_600_000);
  const held = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: target.toISOString() }).expect(201);
  const id = held.body.consultation.id as number;
  await rider.post(`/api/consultations/${id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
  return { rider, fitter, id, startsAt: target };
}

describe('confirmation e-mails', () => {
  it('sends the rider a confirmation with an .ics invite and a receipt, without health details', async () => {
    const { rider, id } = await paidBooking(72);
    const [confirmation] = await waitForMails(rider.user.email, { subject: /^Booked:/ });
    expect(confirmation).toBeDefined();
    const invite = await attachmentText(confirmation!, 'invite.ics');
    const consultation = (await Consultation.findByPk(id))!;
    expect(invite).toContain('METHOD:REQUEST');
    expect(invite).toContain(`UID:${consultation.calendarUid}`);
    expect(invite).toContain(`/consultations/${id}`);
    const [receipt] = await waitForMails(rider.user.email, { subject: /^Receipt:/ });
    expect(receipt!.subject).toContain('€90.00');
    // The rider's intake (a sore front-left knee, an ache) must not travel by e-mail.
    for (const mail of await mailsTo(rider.user.email)) expect(`${mail.subject} ${mail.text} ${mail.html}`).not.toMatch(/knee|\bache\b|red flag|triage|3\/10/i);
  });

  it('sends a welcome e-mail on registration', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const { browserLikeAgent } = await import('../support/app');
    const email = `welcome-${randomUUID().slice(0, 8)}@test.example`;
    await (await browserLikeAgent(saddlestep.app)).post('/api/auth/register', { email, password: 'a-long-password', displayName: 'Wren', role: 'rider', timeZone: 'UTC' }).expect(201);
    const [welcome] = await waitForMails(email, { subject: /Welcome/ });
    expect(welcome?.html).toContain('Saddlestep');
    expect(rider).toBeDefined();
  });
});

describe('rescheduling', () => {
  it('keeps the payment and the calendar UID, raises the sequence and re-sends the invite', async () => {
    const { rider, fitter, id } = await paidBooking(72);
    const before = (await Consultation.findByPk(id))!;
    const newStart = new Date(before.startsAt.getTime() + 5 * 3_600_000);
    const res = await rider.post(`/api/consultations/${id}/reschedule`, { startsAt: newStart.toISOString() }).expect(200);
    expect(res.body.consultation).toMatchObject({ status: 'booked', startsAt: newStart.toISOString(), payment: { status: 'succeeded' } });
    const after = (await Consultation.findByPk(id))!;
    expect(after.calendarUid).toBe(before.calendarUid);
    expect(after.calendarSequence).toBe(before.calendarSequence + 1);
    expect(await Payment.count({ where: { consultationId: id } })).toBe(1);
    const [moved] = await waitForMails(rider.user.email, { subject: /^Moved:/ });
    const invite = await attachmentText(moved!, 'invite.ics');
    expect(invite).toContain(`UID:${before.calendarUid}`);
    expect(invite).toContain('SEQUENCE:1');
    expect(fitter).toBeDefined();
  });

  it('refuses to move a session inside the cancellation window', async () => {
    const { rider, id } = await paidBooking(5);
    const res = await rider.post(`/api/consultations/${id}/reschedule`, { startsAt: new Date(Date.now() + 48 * 3_600_000).toISOString() });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/24 h/);
  });
});

describe('cancellation and refunds', () => {
  it('refunds in full when the rider cancels more than 24 h ahead, and cancels the invite', async () => {
    const { rider, id } = await paidBooking(72);
    const terms = await rider.get(`/api/consultations/${id}/cancellation-terms`).expect(200);
    expect(terms.body.terms).toMatchObject({ amountMinor: 9000, share: 1 });
    const res = await rider.post(`/api/consultations/${id}/cancel`, { reason: 'Plans changed' }).expect(200);
    expect(res.body).toMatchObject({ refundedMinor: 9000, consultation: { status: 'cancelled', payment: { status: 'refunded', refundedMinor: 9000 } } });
    const [notice] = await waitForMails(rider.user.email, { subject: /^Cancelled:/ });
    expect(await attachmentText(notice!, 'cancel.ics')).toContain('METHOD:CANCEL');
  });

  it('refunds half when the rider cancels inside 24 h', async () => {
    const { rider, id } = await paidBooking(6);
    const res = await rider.post(`/api/consultations/${id}/cancel`, {}).expect(200);
    expect(res.body.refundedMinor).toBe(4500);
    const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
    expect(payment.status).toBe('partially_refunded');
  });

  it('quotes exactly what a cancellation then refunds after an earlier partial refund by the studio', async () => {
    const { rider, id } = await paidBooking(6);
    const admin = await signedInAs(saddlestep.app, 'admin');
    const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
    await admin.post(`/api/admin/payments/${payment.id}/refund`, { amountMinor: 2000, reason: 'Goodwill', idempotencyKey: randomUUID() }).expect(200);
    // Half of the €90 fee (€45) is due; €70 is left, so all of it can go back.
    const quoted = (await rider.get(`/api/consultations/${id}/cancellation-terms`).expect(200)).body.terms;
    expect(quoted.amountMinor).toBe(4500);
    const res = await rider.post(`/api/consultations/${id}/cancel`, {}).expect(200);
    expect(res.body.refundedMinor).toBe(quoted.amountMinor);

    // A second booking whose earlier refunds leave less than the policy's share: quote and refund are both capped.
    const second = await paidBooking(6);
    const secondPayment = (await Payment.findOne({ where: { consultationId: second.id } }))!;
    await admin.post(`/api/admin/payments/${secondPayment.id}/refund`, { amountMinor: 6000, reason: 'Goodwill', idempotencyKey: randomUUID() }).expect(200);
    const cappedQuote = (await second.rider.get(`/api/consultations/${second.id}/cancellation-terms`).expect(200)).body.terms;
    expect(cappedQuote.amountMinor).toBe(3000);
    expect(cappedQuote.reason).toMatch(/refunded earlier/);
    expect((await second.rider.post(`/api/consultations/${second.id}/cancel`, {}).expect(200)).body.refundedMinor).toBe(3000);
  });

  it('refunds in full when the fitter cancels, even at short notice', async () => {
    const { fitter, id } = await paidBooking(3);
    const { browserLikeAgent } = await import('../support/app');
    const client = await browserLikeAgent(saddlestep.app);
    const signIn = await client.post('/api/auth/sign-in', { email: fitter.email, password: 'correct-horse-battery' }).expect(200);
    client.csrfToken = signIn.body.csrfToken;
    const res = await client.post(`/api/consultations/${id}/cancel`, { reason: 'Ill today' }).expect(200);
    expect(res.body.refundedMinor).toBe(9000);
  });

  it('never refunds twice when a cancellation is retried', async () => {
    const { rider, id } = await paidBooking(72);
    const [a, b] = await Promise.all([rider.post(`/api/consultations/${id}/cancel`, {}), rider.post(`/api/consultations/${id}/cancel`, {})]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const payment = (await Payment.findOne({ where: { consultationId: id } }))!;
    expect(await Refund.count({ where: { paymentId: payment.id } })).toBe(1);
    expect(payment.refundedMinor).toBe(9000);
  });
});

describe('booking reminders', () => {
  it('sends the 24-hour reminder exactly once with two schedulers running at the same time', async () => {
    const { rider, id } = await paidBooking(30);
    await ScheduledJob.update({ runAt: new Date(Date.now() - 1000) }, { where: { uniqueKey: `booking-reminder:${id}:0` } });
    // A second connection pool stands in for a second server process.
    const otherPool = new Sequelize(process.env.DATABASE_URL!, { dialect: 'mariadb', logging: false, timezone: '+00:00' });
    const first = createAppScheduler(saddlestep.ctx, { instanceId: 'first' });
    const second = createAppScheduler(saddlestep.ctx, { sequelize: otherPool, instanceId: 'second' });
    try {
      await Promise.all([first.tick(), second.tick(), first.tick(), second.tick()]);
      await Promise.all([first.tick(), second.tick()]);
    } finally {
      await otherPool.close();
    }
    const reminders = await waitForMails(rider.user.email, { subject: /^Tomorrow:/, count: 2, timeoutMs: 1500 });
    expect(reminders).toHaveLength(1);
    expect((await ScheduledJob.findOne({ where: { uniqueKey: `booking-reminder:${id}:0` } }))!.status).toBe('done');
  });

  it('never sends a reminder for a cancelled booking', async () => {
    const { rider, id } = await paidBooking(30);
    await rider.post(`/api/consultations/${id}/cancel`, {}).expect(200);
    await ScheduledJob.update({ runAt: new Date(Date.now() - 1000) }, { where: { uniqueKey: `booking-reminder:${id}:0` } });
    await createAppScheduler(saddlestep.ctx).tick();
    expect((await ScheduledJob.findOne({ where: { uniqueKey: `booking-reminder:${id}:0` } }))!.status).toBe('cancelled');
    expect(await waitForMails(rider.user.email, { subject: /^Tomorrow:/, timeoutMs: 500 })).toHaveLength(0);
  });

  it('expires holds whose time ran out on a scheduler tick', async () => {
    const { fitter } = await buildFitter();
    const rider = await riderReadyToBook(saddlestep.app);
    const day = new Date(Date.now() + 9 * 86_400_000).toISOString().slice(0, 10);
    const slots = await rider.get(`/api/fitters/${fitter.id}/slots?from=${day}&to=${day}`).expect(200);
    const held = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: slots.body.slots[0].start }).expect(201);
    await Consultation.update({ holdExpiresAt: new Date(Date.now() - 1000) }, { where: { id: held.body.consultation.id } });
    await createAppScheduler(saddlestep.ctx).tick();
    expect((await Consultation.findByPk(held.body.consultation.id))!.status).toBe('expired');
  });
});

describe('the fitter moves a session', () => {
  it('lists only their own calendar and may move a booking even inside the window', async () => {
    const { fitter, id } = await paidBooking(5);
    const { browserLikeAgent } = await import('../support/app');
    const client = await browserLikeAgent(saddlestep.app);
    const signIn = await client.post('/api/auth/sign-in', { email: fitter.email, password: 'correct-horse-battery' }).expect(200);
    client.csrfToken = signIn.body.csrfToken;
    const day = new Date(Date.now() + 2 * 86_400_000).toISOString().slice(0, 10);
    const slots = await client.get(`/api/fitters/${fitter.id}/slots?from=${day}&to=${day}`).expect(200);
    const { fitter: other } = await buildFitter();
    await client.get(`/api/fitters/${other.id}/slots?from=${day}&to=${day}`).expect(404);
    const moved = await client.post(`/api/consultations/${id}/reschedule`, { startsAt: slots.body.slots[0].start }).expect(200);
    expect(moved.body.consultation.startsAt).toBe(slots.body.slots[0].start);
  });
});
