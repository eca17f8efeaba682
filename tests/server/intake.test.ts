import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CONSENT_TEXTS, currentConsent } from '@shared/rider';
import { AuditEntry, Consent, Intake } from '@server/models';
import { assertRiderMayBook } from '@server/services/intake-gate';
import { consentTextHash } from '@server/services/consents';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { signedInAs } from '../support/factories';
import { allNo, bikeBody, kneeSymptom, submitBody, submitIntake, URGENT_FLAG } from '../support/rider-factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  saddlestep = await startTestApp();
});
afterAll(async () => {
  await saddlestep.close();
});

describe('intake drafts', () => {
  it('saves a half-filled draft and gives it back to resume', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const draft = { symptoms: [{ region: 'knee-front-left', pain: 4 }, { region: 'lower-back' }], redFlagAnswers: { 'leg-weakness': false }, goals: ['ride-longer'] };
    const saved = await rider.put('/api/rider/intake/draft', draft).expect(200);
    expect(saved.body.intake).toMatchObject({ status: 'draft', triage: null, consent: null });

    const resumed = await rider.get('/api/rider/intake').expect(200);
    expect(resumed.body.submitted).toBeNull();
    expect(resumed.body.draft.symptoms).toEqual([{ region: 'knee-front-left', pain: 4, timing: [] }, { region: 'lower-back', timing: [] }]);
    expect(resumed.body.draft.redFlagAnswers).toEqual({ 'leg-weakness': false });
  });

  it('keeps one draft per rider, updating it on each save', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await rider.put('/api/rider/intake/draft', { goals: ['ride-longer'] }).expect(200);
    await Promise.all([
      rider.put('/api/rider/intake/draft', { goals: ['more-comfort'] }),
      rider.put('/api/rider/intake/draft', { goals: ['event'] }),
    ]);
    expect(await Intake.count({ where: { riderId: rider.user.id } })).toBe(1);
  });

  it('refuses a bike that is not the rider\'s own', async () => {
    const owner = await signedInAs(saddlestep.app, 'rider');
    const bike = (await owner.post('/api/rider/bikes', bikeBody()).expect(201)).body.bike;
    const other = await signedInAs(saddlestep.app, 'rider');
    const res = await other.put('/api/rider/intake/draft', { bikeId: bike.id }).expect(400);
    expect(res.body.error.fields.bikeId).toMatch(/your own bikes/);
    expect(await Intake.count({ where: { riderId: other.user.id } })).toBe(0);
  });

  it('discards a draft', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await rider.put('/api/rider/intake/draft', { goals: ['ride-longer'] }).expect(200);
    await rider.delete('/api/rider/intake/draft').expect(204);
    expect((await rider.get('/api/rider/intake')).body.draft).toBeNull();
    await rider.delete('/api/rider/intake/draft').expect(404);
  });
});

describe('POST /api/rider/intake/submit', () => {
  it('turns the draft into a submitted intake with the triage computed on the server', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const draft = (await rider.put('/api/rider/intake/draft', { symptoms: [{ region: 'knee-front-left' }] }).expect(200)).body.intake;
    const res = await rider.post('/api/rider/intake/submit', submitBody()).expect(201);
    expect(res.body.intake).toMatchObject({ id: draft.id, status: 'submitted', triage: { level: 'none' } });
    expect(res.body.intake.triage.advice).toMatch(/No warning signs/);
    // Fit causes are for the fitter; the rider's view leaves them out.
    expect(res.body.intake.triage.causes).toBeUndefined();
    expect(res.body.readiness).toMatchObject({ ready: true, level: 'none', intakeId: draft.id, flaggedForPhysio: false });
    const stored = await Intake.findByPk(draft.id);
    expect(stored?.triage?.causes?.[0]?.cause).toBe('saddle-low'); // front of knee → saddle low first (Silberman 2005)
  });

  it('ignores any triage a client sends: the extra field is refused', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.post('/api/rider/intake/submit', { ...submitBody(), triage: { level: 'none' } }).expect(400);
    expect(res.body.error.message).toMatch(/Unexpected field: triage/);
    expect(await Intake.count({ where: { riderId: rider.user.id } })).toBe(0);
  });

  it('stores the consent with its version and a hash of the exact text', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const { intake } = await submitIntake(rider);
    const consent = await Consent.findOne({ where: { userId: rider.user.id } });
    const text = currentConsent('store-health-data')!;
    expect(consent).toMatchObject({ kind: 'store-health-data', version: text.version, textHash: consentTextHash(text.text), withdrawnAt: null });
    expect(consent!.givenAt.getTime()).toBeGreaterThan(Date.now() - 60_000);
    expect((await Intake.findByPk(intake.id))?.consentId).toBe(consent!.id);
    expect(CONSENT_TEXTS['store-health-data'].some((t) => t.version === consent!.version)).toBe(true);
  });

  it('requires the consent box, and writes nothing without it', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const body: Record<string, unknown> = submitBody();
    delete body.consent;
    const res = await rider.post('/api/rider/intake/submit', body).expect(400);
    expect(res.body.error.fields.consent).toMatch(/tick the box/);
    const unticked = await rider.post('/api/rider/intake/submit', submitBody({ consent: { kind: 'store-health-data', version: currentConsent('store-health-data')!.version, agreed: false } })).expect(400);
    expect(unticked.body.error.fields['consent.agreed']).toMatch(/tick the box/);
    expect(await Consent.count({ where: { userId: rider.user.id } })).toBe(0);
    expect(await Intake.count({ where: { riderId: rider.user.id } })).toBe(0);
  });

  it('refuses a consent version the rider was not shown with 409', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.post('/api/rider/intake/submit', submitBody({ consent: { kind: 'store-health-data', version: '2001-01-01', agreed: true } })).expect(409);
    expect(res.body.error.message).toMatch(/consent text has changed/);
    expect(await Intake.count({ where: { riderId: rider.user.id } })).toBe(0);
  });

  it('validates strictly on submit: incomplete symptoms and unanswered safety questions', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.post('/api/rider/intake/submit', submitBody({ symptoms: [{ region: 'knee-front-left', pain: 4 }], redFlagAnswers: {} })).expect(400);
    expect(res.body.error.fields['symptoms.0.kind']).toMatch(/what the pain feels like/);
    expect(res.body.error.fields['symptoms.0.timing']).toMatch(/when it hurts/);
    const unanswered = await rider.post('/api/rider/intake/submit', submitBody({ redFlagAnswers: { 'leg-weakness': false } })).expect(400);
    expect(unanswered.body.error.message).toMatch(/answer every safety question/);
  });

  it('asks the crash follow-up questions only after a crash', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const crash = [kneeSymptom({ afterCrash: true })];
    const missing = { ...allNo(), 'crash-or-fall': true };
    await rider.post('/api/rider/intake/submit', submitBody({ symptoms: crash, redFlagAnswers: missing })).expect(400);
    const res = await rider.post('/api/rider/intake/submit', submitBody({ symptoms: crash, redFlagAnswers: { ...allNo(crash), 'crash-or-fall': true } })).expect(201);
    expect(res.body.intake.triage.level).toBe('physio-routine');
  });
});

describe('triage levels and booking readiness', () => {
  it('blocks booking with the stop-riding notice at the urgent level', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.post('/api/rider/intake/submit', submitBody({ redFlagAnswers: { ...allNo(), [URGENT_FLAG]: true } })).expect(201);
    expect(res.body.intake.triage.level).toBe('urgent');
    expect(res.body.intake.triage.advice).toMatch(/Stop riding and seek urgent medical care/);
    const readiness = await rider.get('/api/rider/booking-readiness').expect(200);
    expect(readiness.body).toMatchObject({ ready: false, code: 'urgent', level: 'urgent' });
    expect(readiness.body.reason).toMatch(/stop riding and get urgent medical care today/);
    await expect(assertRiderMayBook(rider.user.id)).rejects.toMatchObject({ status: 403, code: 'urgent_care_first' });
  });

  it('allows booking at the physio level and flags the case', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const symptoms = [kneeSymptom({ pain: 8 })]; // pain ≥ 7/10 → physio (TRADE §6)
    const res = await rider.post('/api/rider/intake/submit', submitBody({ symptoms, redFlagAnswers: allNo(symptoms) })).expect(201);
    expect(res.body.intake.triage.level).toBe('physio-soon');
    const readiness = await rider.get('/api/rider/booking-readiness').expect(200);
    expect(readiness.body).toMatchObject({ ready: true, code: 'ready', level: 'physio-soon', flaggedForPhysio: true, intakeId: res.body.intake.id });
    await expect(assertRiderMayBook(rider.user.id)).resolves.toEqual({ intakeId: res.body.intake.id, flaggedForPhysio: true });
  });

  it('is not ready without a submitted intake, and says why', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await rider.put('/api/rider/intake/draft', { goals: ['ride-longer'] }).expect(200);
    const readiness = await rider.get('/api/rider/booking-readiness').expect(200);
    expect(readiness.body).toMatchObject({ ready: false, code: 'no-intake', level: null, flaggedForPhysio: false });
    await expect(assertRiderMayBook(rider.user.id)).rejects.toMatchObject({ status: 409, code: 'intake_required' });
  });

  it('is not ready once the consent is withdrawn, until the rider consents again', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await submitIntake(rider);
    const consent = (await rider.get('/api/rider/consents').expect(200)).body.consents[0];
    const withdrawn = await rider.post(`/api/rider/consents/${consent.id}/withdraw`).expect(200);
    expect(withdrawn.body.consent.withdrawnAt).toEqual(expect.any(String));
    await rider.post(`/api/rider/consents/${consent.id}/withdraw`).expect(409);
    expect((await rider.get('/api/rider/booking-readiness')).body).toMatchObject({ ready: false, code: 'no-consent' });
    await expect(assertRiderMayBook(rider.user.id)).rejects.toMatchObject({ status: 409, code: 'consent_required' });
    await submitIntake(rider);
    expect((await rider.get('/api/rider/booking-readiness')).body.ready).toBe(true);
  });

  it('lets an updated intake lift the urgent block (after care)', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    await submitIntake(rider, { redFlagAnswers: { ...allNo(), [URGENT_FLAG]: true } });
    await submitIntake(rider);
    expect((await rider.get('/api/rider/booking-readiness')).body).toMatchObject({ ready: true, level: 'none' });
  });
});

describe('GET /api/intakes/:id', () => {
  it('shows the rider their own intake and writes an intake.read audit row', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const { intake } = await submitIntake(rider);
    const res = await rider.get(`/api/intakes/${intake.id}`).expect(200);
    expect(res.body.intake.id).toBe(intake.id);
    expect(await AuditEntry.count({ where: { action: 'intake.read', subjectId: String(intake.id), actorId: rider.user.id } })).toBeGreaterThan(0);
  });

  it('answers 404 to another rider, an unrelated fitter and an admin', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const { intake } = await submitIntake(rider);
    for (const role of ['rider', 'fitter', 'physio'] as const) {
      const other = await signedInAs(saddlestep.app, role);
      await other.get(`/api/intakes/${intake.id}`).expect(404);
    }
    const admin = await signedInAs(saddlestep.app, 'admin');
    await admin.get(`/api/intakes/${intake.id}`).expect(403);
  });
});
