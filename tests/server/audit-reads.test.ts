import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { Op } from 'sequelize';
import { currentConsent } from '@shared/rider';
import { AuditEntry } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { caseOnStepOne, checkInBody } from '../support/care-factories';

/**
 * Every route that reads health data writes an audit row naming who (actor and role), what (the
 * action), whose data (the rider) and from where (ip and user agent), with no health content.
 */
let saddlestep: SaddlestepApp;
let c: Awaited<ReturnType<typeof caseOnStepOne>>;
const ids = { intake: 0, upload: 0, referral: 0 };
const AGENT = 'audit-reads-test/1.0';

beforeAll(async () => {
  saddlestep = await startTestApp();
  c = await caseOnStepOne(saddlestep.app);
  const png = await sharp({ create: { width: 20, height: 20, channels: 3, background: '#246' } }).png().toBuffer();
  ids.upload = (await c.rider.agent.post('/api/rider/uploads').set('X-CSRF-Token', c.rider.csrfToken).field('view', 'front').attach('file', png, 'p.png')).body.upload.id;
  ids.intake = (await c.rider.get('/api/rider/intake').expect(200)).body.submitted.id;
  // A much worse check-in puts the rider on the fitter's follow-up list.
  await c.rider.post(`/api/plans/${c.planId}/steps/1/check-ins`, checkInBody({ pains: [{ region: 'knee-front-left', pain: 6 }], comfort: 3 })).expect(201);
  const referral = await c.fitter.post(`/api/consultations/${c.consultation.id}/referrals`, { urgency: 'soon', reason: 'Knee', attachmentIds: [ids.upload], physioId: c.physio.user.id }).expect(201);
  ids.referral = referral.body.referral.id;
  await c.rider.post(`/api/rider/referrals/${ids.referral}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
  await c.physio.post(`/api/physio/referrals/${ids.referral}/accept`).expect(200);
});
afterAll(async () => {
  await saddlestep.close();
});

/** Keep every answer as bytes (the export is a zip, files are images). */
const raw = (response: import('superagent').Response, done: (err: Error | null, body: unknown) => void) => {
  const chunks: Buffer[] = [];
  response.on('data', (chunk: Buffer) => chunks.push(chunk));
  response.on('end', () => done(null, Buffer.concat(chunks)));
};

/** The route with this case's ids in place of `:intake`, `:upload`, `:consultation`… */
const resolve = (path: string) => path.replace(/:(intake|upload|referral|consultation|plan|bike)\b/g, (_, key: string) =>
  String({ intake: ids.intake, upload: ids.upload, referral: ids.referral, consultation: c.consultation.id, plan: c.planId, bike: c.bikeId }[key]));

type Reader = 'rider' | 'fitter' | 'physio';
const reads: [Reader, string, string][] = [
  ['rider', '/api/rider/profile', 'profile.read'],
  ['rider', '/api/rider/intake', 'intake.read'],
  ['rider', '/api/rider/consents', 'consent.read'],
  ['rider', '/api/rider/uploads', 'upload.list'],
  ['rider', '/api/rider/check-ins', 'checkin.read'],
  ['rider', '/api/rider/plans/current', 'plan.read'],
  ['rider', '/api/rider/referrals', 'referral.read'],
  ['rider', '/api/rider/export', 'account.export'],
  ['fitter', '/api/intakes/:intake', 'intake.read'],
  ['fitter', '/api/uploads/:upload/file', 'upload.read'],
  ['fitter', '/api/uploads/:upload/thumbnail', 'upload.read'],
  ['fitter', '/api/consultations/:consultation/case', 'case.read'],
  ['fitter', '/api/consultations/:consultation/plan-inputs?bikeId=:bike', 'plan.inputs_read'],
  ['fitter', '/api/consultations/:consultation/plans', 'plan.read'],
  ['fitter', '/api/plans/:plan', 'plan.read'],
  ['fitter', '/api/consultations/:consultation/notes', 'note.read'],
  ['fitter', '/api/consultations/:consultation/check-ins', 'checkin.read'],
  ['fitter', '/api/consultations/:consultation/referrals', 'referral.read'],
  ['fitter', '/api/uploads/:upload/measurements?consultationId=:consultation', 'measurement.read'],
  ['fitter', '/api/fitter/follow-ups', 'followup.read'],
  ['physio', '/api/physio/referrals', 'referral.read'],
  ['physio', '/api/physio/referrals/:referral/case', 'referral.case_read'],
  ['physio', '/api/consultations/:consultation/check-ins', 'checkin.read'],
  ['physio', '/api/intakes/:intake', 'intake.read'],
  ['physio', '/api/uploads/:upload/thumbnail', 'upload.read'],
];

describe('audit rows for health-data reads', () => {
  for (const [who, path, action] of reads) {
    it(`${who} GET ${path} → ${action}`, async () => {
      const client = c[who];
      const newest = async () => (await AuditEntry.max('id')) as number | null;
      const before = (await newest()) ?? 0;
      const res = await client.agent.get(resolve(path)).set('User-Agent', AGENT).buffer(true).parse(raw);
      expect(res.status).toBe(200);
      const row = await AuditEntry.findOne({ where: { id: { [Op.gt]: before }, actorId: client.user.id, action, subjectUserId: c.rider.user.id }, order: [['id', 'DESC']] });
      expect(row).not.toBeNull();
      expect(row).toMatchObject({ actorRole: who, userAgent: AGENT, ip: expect.stringMatching(/\S/), subjectType: expect.stringMatching(/\S/), subjectId: expect.stringMatching(/\S/) });
      expect(Object.keys(row!.detail ?? {})).not.toEqual(expect.arrayContaining(['level']));
      expect(Object.keys(row!.detail ?? {})).not.toEqual(expect.arrayContaining(['decision']));
    });
  }

  it('keeps health content out of audit details written for this rider', async () => {
    const rows = await AuditEntry.findAll({ where: { subjectUserId: c.rider.user.id } });
    expect(rows.map((r) => r.action)).toEqual(expect.arrayContaining(['intake.submit', 'checkin.create', 'referral.create']));
    for (const row of rows) expect(JSON.stringify(row.detail ?? {})).not.toMatch(/level|decision|urgent|suggest-revert|hold-for-review|knee/);
  });
});
