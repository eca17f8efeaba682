import { describe, expect, it } from 'vitest';
import type { Ack } from '@shared/http';
import type { UnreadCount } from '@shared/chat';
import { currentConsent } from '@shared/rider';
import { ScheduledJob } from '@server/models';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { signedInAs } from '../support/factories';
import { ask } from '../support/sockets';
import { chatSuite, ok, send } from '../support/chat-suite';
import { bookedPair } from '../support/chat-factories';
import { waitForMails } from '../support/mail';
import { caseWithBike, TEST_SETUP } from '../support/plan-factories';
import { sendBuiltPlan } from '../support/care-factories';

const suite = chatSuite();
const connect = suite.connect;
const noticeJobsFor = async (consultationId: number) =>
  (await ScheduledJob.findAll({ where: { kind: 'chat-notice' } })).filter((j) => (j.payload as { consultationId: number }).consultationId === consultationId).map((j) => (j.payload as { userId: number }).userId);

describe('unread notices', () => {
  it('counts a fitter signed in on another page as away: a live unread count in their own room, and the e-mail notice', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const riderSocket = await connect(rider);
    ok(await ask(riderSocket, 'room:join', { consultationId: consultation.id }));
    // The fitter's socket is open (signed in, on their home page) but not in the room.
    const fitterSocket = await connect(fitter);
    const counts: UnreadCount[] = [];
    fitterSocket.on('unread:changed', (u: UnreadCount) => counts.push(u));
    ok(await send(riderSocket, consultation.id, 'one'));
    ok(await send(riderSocket, consultation.id, 'two'));
    await new Promise((r) => setTimeout(r, 150));
    expect(counts).toEqual([{ consultationId: consultation.id, count: 1 }, { consultationId: consultation.id, count: 2 }]);
    expect(ok(await ask<Ack<UnreadCount[]>>(fitterSocket, 'unread:list', {}))).toEqual([{ consultationId: consultation.id, count: 2 }]);
    expect(await noticeJobsFor(consultation.id)).toEqual([fitter.user.id]);

    // Reading in the room clears the badge in every tab of the fitter.
    const otherTab = await connect(fitter);
    const cleared = new Promise<UnreadCount>((resolve) => otherTab.on('unread:changed', resolve));
    ok(await ask(fitterSocket, 'room:join', { consultationId: consultation.id }));
    ok(await ask(fitterSocket, 'message:read', { consultationId: consultation.id, seq: 2 }));
    expect(await cleared).toEqual({ consultationId: consultation.id, count: 0 });
    expect(ok(await ask<Ack<UnreadCount[]>>(otherTab, 'unread:list', {}))).toEqual([]);
  });

  it('treats a plan card like a message: the rider away from the room gets the count and the e-mail notice', async () => {
    const c = await caseWithBike(suite.saddlestep.app, { started: true });
    const riderSocket = await connect(c.rider);
    const counts: UnreadCount[] = [];
    riderSocket.on('unread:changed', (u: UnreadCount) => counts.push(u));
    const sent = await sendBuiltPlan(c, { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 3 });
    expect(sent.status, JSON.stringify(sent.body)).toBe(201);
    await new Promise((r) => setTimeout(r, 150));
    expect(counts).toContainEqual({ consultationId: c.consultation.id, count: 1 });
    expect(await noticeJobsFor(c.consultation.id)).toEqual([c.rider.user.id]);
  });

  it('sends no e-mail notice to someone in the room', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const riderSocket = await connect(rider);
    const fitterSocket = await connect(fitter);
    for (const s of [riderSocket, fitterSocket]) ok(await ask(s, 'room:join', { consultationId: consultation.id }));
    ok(await send(riderSocket, consultation.id, 'here?'));
    expect(await noticeJobsFor(consultation.id)).toEqual([]);
  });

  it('includes a referred physio with consented access, and mails them no message text', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const physio = await signedInAs(suite.saddlestep.app, 'physio');
    const made = await fitter.post(`/api/consultations/${consultation.id}/referrals`, { urgency: 'soon', reason: 'Knee pain for a physio to see', findings: 'Ache after an hour.', attachmentIds: [], physioId: physio.user.id }).expect(201);
    const referralId = made.body.referral.id as number;
    await rider.post(`/api/rider/referrals/${referralId}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
    await physio.post(`/api/physio/referrals/${referralId}/accept`).expect(200);

    const fitterSocket = await connect(fitter);
    ok(await ask(fitterSocket, 'room:join', { consultationId: consultation.id }));
    ok(await send(fitterSocket, consultation.id, 'the knee tracks inwards'));
    expect((await noticeJobsFor(consultation.id)).sort()).toEqual([rider.user.id, physio.user.id].sort());
    const jobs = await ScheduledJob.findAll({ where: { kind: 'chat-notice' } });
    const mine = jobs.filter((j) => (j.payload as { consultationId: number }).consultationId === consultation.id);
    await ScheduledJob.update({ runAt: new Date(Date.now() - 1000) }, { where: { id: mine.map((j) => j.id) } });
    await createAppScheduler(suite.saddlestep.ctx).tick();
    const mails = await waitForMails(physio.user.email, { subject: /New messages/ });
    expect(mails).toHaveLength(1);
    expect(`${mails[0]!.text} ${mails[0]!.html}`).not.toMatch(/knee|inwards/);
  });
});
