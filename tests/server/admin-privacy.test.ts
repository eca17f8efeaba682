import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import AdmZip from 'adm-zip';
import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { currentConsent } from '@shared/rider';
import { AuditEntry, Bike, CheckIn, Consent, Consultation, ConsultationEvent, FitterNote, Intake, Message, Payment, Plan, Referral, Upload, User } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { signedInAs, TEST_PASSWORD } from '../support/factories';
import { buildFitter, riderReadyToBook } from '../support/booking-factories';
import { caseOnStepOne, checkInBody } from '../support/care-factories';
import { ask, listenOnFreePort } from '../support/sockets';
import { socketFor } from '../support/chat-factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

describe('admin: people and policy', () => {
  it('changes a role and switches an account off, ending its sessions', async () => {
    const admin = await signedInAs(saddlestep.app, 'admin');
    const rider = await signedInAs(saddlestep.app, 'rider');
    const list = await admin.get(`/api/admin/users?q=${encodeURIComponent(rider.user.email)}`).expect(200);
    expect(list.body.users.map((u: { id: number }) => u.id)).toEqual([rider.user.id]);
    await admin.patch(`/api/admin/users/${rider.user.id}`, { status: 'disabled' }).expect(200);
    await rider.get('/api/auth/me').expect(401);
    await admin.patch(`/api/admin/users/${rider.user.id}`, { status: 'active', role: 'fitter' }).expect(200);
    expect((await User.findByPk(rider.user.id))!.role).toBe('fitter');
  });

  it('keeps an admin from locking themself out', async () => {
    const admin = await signedInAs(saddlestep.app, 'admin');
    const res = await admin.patch(`/api/admin/users/${admin.user.id}`, { status: 'disabled' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/own account/);
    await admin.patch(`/api/admin/users/${admin.user.id}`, {}).expect(400);
    await admin.patch(`/api/admin/users/${admin.user.id}`, { role: 'overlord' }).expect(400);
  });

  it('saves a policy within the hard bounds and refuses one outside them', async () => {
    // The stem-length cap: no test's plan moves the stem, so plans built in parallel are not disturbed.
    const admin = await signedInAs(saddlestep.app, 'admin');
    const current = (await admin.get('/api/admin/settings').expect(200)).body;
    expect(current.hardBounds.stepCaps.stemLength).toHaveLength(2);
    const [, max] = current.hardBounds.stepCaps.stemLength as [number, number];
    const ok = { ...current.settings, planner: { ...current.settings.planner, stepCaps: { ...current.settings.planner.stepCaps, stemLength: 5 } } };
    expect((await admin.put('/api/admin/settings', { settings: ok }).expect(200)).body.settings.planner.stepCaps.stemLength).toBe(5);
    const tooBig = { ...ok, planner: { ...ok.planner, stepCaps: { ...ok.planner.stepCaps, stemLength: max + 5 } } };
    const refused = await admin.put('/api/admin/settings', { settings: tooBig });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields['planner.stepCaps.stemLength']).toMatch(/Allowed/);
    expect((await admin.get('/api/admin/settings').expect(200)).body.settings.planner.stepCaps.stemLength).toBe(5);
    // Put the default back for other tests sharing the database.
    await admin.put('/api/admin/settings', { settings: current.settings }).expect(200);
  });

  it('lists payments and refunds part of one through Stripe', async () => {
    const admin = await signedInAs(saddlestep.app, 'admin');
    const { fitter } = await buildFitter();
    const rider = await riderReadyToBook(saddlestep.app);
    const day = new Date(Date.now() + 8 * 86_400_000).toISOString().slice(0, 10);
    const slot = (await rider.get(`/api/fitters/${fitter.id}/slots?from=${day}&to=${day}`).expect(200)).body.slots[0].start;
    const held = await rider.post('/api/consultations', { fitterId: fitter.id, startsAt: slot }).expect(201);
    await rider.post(`/api/consultations/${held.body.consultation.id}/payment`, { token: 'tok_visa', attemptKey: randomUUID() }).expect(200);
    const payment = (await Payment.findOne({ where: { consultationId: held.body.consultation.id } }))!;
    const list = await admin.get('/api/admin/payments').expect(200);
    expect(list.body.payments.map((p: { id: number }) => p.id)).toContain(payment.id);
    const refunded = await admin.post(`/api/admin/payments/${payment.id}/refund`, { amountMinor: 1000, reason: 'Goodwill' }).expect(200);
    expect(refunded.body.payment).toMatchObject({ refundedMinor: 1000, status: 'partially_refunded' });
    await admin.post(`/api/admin/payments/${payment.id}/refund`, { amountMinor: 999_999, reason: 'Too much' }).expect(409);
  });

  it('shows the access log and cannot change it', async () => {
    const admin = await signedInAs(saddlestep.app, 'admin');
    const page = await admin.get('/api/admin/audit?limit=5').expect(200);
    expect(page.body.entries).toHaveLength(5);
    expect(page.body.nextBeforeId).toEqual(expect.any(Number));
    const row = await AuditEntry.findOne();
    await expect(row!.update({ action: 'tampered' })).rejects.toThrow(/append-only/);
    await expect(saddlestep.sequelize.query('UPDATE audit_entries SET action = "tampered" LIMIT 1')).rejects.toThrow(/append-only/);
    await expect(saddlestep.sequelize.query('DELETE FROM audit_entries LIMIT 1')).rejects.toThrow(/append-only/);
  });
});

describe('rider privacy', () => {
  it('audits reads of health data', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    const before = await AuditEntry.count({ where: { actorId: c.fitter.user.id, action: 'case.read' } });
    await c.fitter.get(`/api/consultations/${c.consultation.id}/case`).expect(200);
    expect(await AuditEntry.count({ where: { actorId: c.fitter.user.id, action: 'case.read', subjectUserId: c.rider.user.id } })).toBe(before + 1);
    await c.rider.get('/api/rider/check-ins').expect(200);
    expect(await AuditEntry.count({ where: { actorId: c.rider.user.id, action: 'checkin.read' } })).toBeGreaterThan(0);
  });

  it('exports everything as data.json plus the files, and audits the export', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody()).expect(201);
    const png = await sharp({ create: { width: 30, height: 20, channels: 3, background: '#333' } }).png().toBuffer();
    const uploaded = await c.rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', c.rider.csrfToken).field('view', 'rear').attach('file', png, 'r.png');
    const res = await c.rider.agent.get('/api/rider/export').buffer(true).parse((response, done) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers["content-disposition"]).toMatch(/attachment; filename="?saddlestep-export-/);
    const zip = new AdmZip(res.body as Buffer);
    const data = JSON.parse(zip.readAsText('data.json'));
    for (const key of ['account', 'profile', 'bikes', 'intakes', 'consents', 'uploads', 'consultations', 'messages', 'plans', 'checkIns', 'referrals']) expect(data).toHaveProperty(key);
    expect(data.account.email).toBe(c.rider.user.email);
    expect(data.checkIns).toHaveLength(1);
    expect(data.plans[0].id).toBe(c.planId);
    expect(data.messages.some((m: { kind: string }) => m.kind === 'plan')).toBe(true);
    const file = data.uploads.find((u: { id: number }) => u.id === uploaded.body.upload.id).file as string;
    expect(zip.getEntry(file)?.getData().length).toBeGreaterThan(0);
    expect(await AuditEntry.count({ where: { action: 'account.export', subjectUserId: c.rider.user.id } })).toBe(1);
  });

  it('deletes the account: health data and files gone, payments kept without the person, audited', async () => {
    const c = await caseOnStepOne(saddlestep.app);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody()).expect(201);
    // Health text in every place it can land: referral, physio hold and clear-hold notes (the
    // consultation's history), a fitter's note, a chat message, an urgent check-in's hold.
    const words = `erase-me-${randomUUID().slice(0, 8)}`;
    const referral = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'soon', reason: `${words} reason`, findings: `${words} findings`, attachmentIds: [], physioId: c.physio.user.id }).expect(201);
    const referralId = referral.body.referral.id as number;
    await c.rider.post(`/api/rider/referrals/${referralId}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
    await c.physio.post(`/api/physio/referrals/${referralId}/accept`).expect(200);
    await c.physio.post(`/api/physio/referrals/${referralId}/respond`, { note: `${words} response`, decision: 'hold', holdReason: `${words} hold` }).expect(200);
    await c.physio.post(`/api/physio/referrals/${referralId}/clear-hold`, { note: `${words} cleared` }).expect(200);
    await c.fitter.post(`/api/consultations/${c.consultation.id}/notes`, { body: `${words} note` }).expect(201);
    await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ note: `${words} check-in`, redFlagAnswers: { 'saddle-numbness-persists': true } })).expect(201);
    const socket = await socketFor(await listenOnFreePort(saddlestep), c.rider);
    await ask(socket, 'room:join', { consultationId: c.consultation.id, afterSeq: 0 });
    expect(await ask(socket, 'message:send', { consultationId: c.consultation.id, clientId: randomUUID(), body: `${words} message` })).toMatchObject({ status: 'OK' });
    socket.close();
    await c.consultation.update({ flaggedForPhysio: true });
    await Payment.create({ consultationId: c.consultation.id, riderId: c.rider.user.id, attemptKey: randomUUID(), stripeCustomerId: `cus_${words}`, stripeChargeId: `ch_${randomUUID().slice(0, 8)}`, amountMinor: 9000, currency: 'EUR', status: 'succeeded', failureMessage: null });
    expect((await ConsultationEvent.findAll({ where: { consultationId: c.consultation.id } })).map((e) => e.note).join(' ')).toMatch(/Paused by the physiotherapist.*Urgent warning signs/);
    const png = await sharp({ create: { width: 30, height: 20, channels: 3, background: '#999' } }).png().toBuffer();
    const uploaded = await c.rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', c.rider.csrfToken).field('view', 'rear').attach('file', png, 'r.png');
    const upload = (await Upload.findByPk(uploaded.body.upload.id))!;
    const filePath = path.join(saddlestep.ctx.config.UPLOAD_DIR, upload.storageName);
    expect(fs.existsSync(filePath) || fs.existsSync(path.resolve(saddlestep.ctx.config.UPLOAD_DIR, upload.storageName))).toBe(true);

    await c.rider.agent.delete('/api/rider/account').set('X-CSRF-Token', c.rider.csrfToken).send({ password: 'wrong-password', confirm: 'DELETE' }).expect(400);
    await c.rider.agent.delete('/api/rider/account').set('X-CSRF-Token', c.rider.csrfToken).send({ password: TEST_PASSWORD }).expect(400);
    await c.rider.agent.delete('/api/rider/account').set('X-CSRF-Token', c.rider.csrfToken).send({ password: TEST_PASSWORD, confirm: 'DELETE' }).expect(204);

    const riderId = c.rider.user.id;
    expect(await Intake.count({ where: { riderId } })).toBe(0);
    expect(await CheckIn.count({ where: { riderId } })).toBe(0);
    expect(await Upload.count({ where: { riderId } })).toBe(0);
    expect(await Bike.count({ where: { riderId } })).toBe(0);
    expect(fs.existsSync(path.resolve(saddlestep.ctx.config.UPLOAD_DIR, upload.storageName))).toBe(false);
    const tombstone = (await User.findByPk(riderId))!;
    expect(tombstone).toMatchObject({ displayName: 'Deleted rider', status: 'disabled' });
    expect(tombstone.email).not.toBe(c.rider.user.email);
    expect(await AuditEntry.count({ where: { action: 'account.delete', subjectUserId: riderId } })).toBe(1);
    await c.rider.get('/api/auth/me').expect(401);

    const consultationId = c.consultation.id;
    expect(await ConsultationEvent.count({ where: { consultationId } })).toBeGreaterThan(2);
    expect((await ConsultationEvent.findAll({ where: { consultationId } })).every((e) => e.note === null)).toBe(true);
    expect(await Consultation.findByPk(consultationId)).toMatchObject({ flaggedForPhysio: false, intakeId: null, cancelReason: null });
    const left = [await Referral.count({ where: { riderId } }), await Plan.count({ where: { riderId } }), await Consent.count({ where: { userId: riderId } }), await Message.count({ where: { consultationId } }), await FitterNote.count({ where: { consultationId } })];
    expect(left).toEqual([0, 0, 0, 0, 0]);
    expect(await Payment.findOne({ where: { consultationId } })).toMatchObject({ riderId: null, stripeCustomerId: null, amountMinor: 9000 });
    // Audit rows stay (append-only) and hold only ids and action names: no triage level or decision.
    const audit = await AuditEntry.findAll({ where: { subjectUserId: riderId } });
    expect(audit.length).toBeGreaterThan(5);
    expect(audit.some((row) => row.detail && ('decision' in row.detail || 'level' in row.detail))).toBe(false);
    // Nothing anywhere in the database still carries the rider's words, e-mail or the system's hold texts for them.
    const [tables] = await saddlestep.sequelize.query('SHOW TABLES');
    for (const table of (tables as Record<string, string>[]).map((row) => Object.values(row)[0]!)) {
      const [rows] = await saddlestep.sequelize.query(`SELECT * FROM \`${table}\``);
      const text = JSON.stringify(rows);
      expect(text, table).not.toContain(words);
      expect(text, table).not.toContain(c.rider.user.email);
    }
  });
});
