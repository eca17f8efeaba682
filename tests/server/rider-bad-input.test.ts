import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Bike, Consent, Intake, RiderProfile, SetupSnapshot } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { signedInAs } from '../support/factories';
import { bikeBody, roadSetup, submitBody, today } from '../support/rider-factories';

let saddlestep: SaddlestepApp;
let rider: Awaited<ReturnType<typeof signedInAs>>;
let bikeId: number;

beforeAll(async () => {
  saddlestep = await startTestApp();
  rider = await signedInAs(saddlestep.app, 'rider');
  bikeId = (await rider.post('/api/rider/bikes', bikeBody()).expect(201)).body.bike.id;
});
afterAll(async () => {
  await saddlestep.close();
});

/** Everything this rider has stored; a refused request must leave every number unchanged. */
async function stored() {
  const userId = rider.user.id;
  const [profiles, bikes, snapshots, intakes, consents] = await Promise.all([
    RiderProfile.count({ where: { userId } }),
    Bike.count({ where: { riderId: userId } }),
    SetupSnapshot.count({ where: { createdBy: userId } }),
    Intake.count({ where: { riderId: userId } }),
    Consent.count({ where: { userId } }),
  ]);
  const bike = await Bike.findByPk(bikeId);
  return { profiles, bikes, snapshots, intakes, consents, bikeName: bike?.name, bikeKind: bike?.kind };
}

type Method = 'put' | 'post' | 'patch';
interface Route {
  label: string;
  method: Method;
  path: () => string;
  valid: () => Record<string, unknown>;
  missing: string[];
  long: [string, unknown][];
  wrongType: [string, unknown][];
  sqlLike: [string, unknown][];
  scriptLike: [string, unknown][];
}

const SQL = "1'; DROP TABLE bikes; --";
const SCRIPT = '<script>alert(document.cookie)</script>';
const snapshot = () => ({ unit: 'mm', setup: roadSetup(), takenOn: today(), cleatNotes: 'centred' });

const ROUTES: Route[] = [
  {
    method: 'put', label: '/api/rider/profile', path: () => '/api/rider/profile',
    valid: () => ({ unit: 'mm', height: 1780, inseam: 842, birthYear: 1986, flexibility: 'average', ridingStyle: 'road', hoursPerWeek: 6, ridesPerWeek: 4, injuryHistory: 'None' }),
    missing: ['unit'],
    long: [['injuryHistory', 'x'.repeat(2001)]],
    wrongType: [['height', '1780'], ['birthYear', 1986.5], ['ridesPerWeek', true], ['injuryHistory', 12]],
    sqlLike: [['flexibility', SQL], ['inseam', SQL], ['unit', SQL]],
    scriptLike: [['injuryHistory', SCRIPT], ['ridingStyle', SCRIPT]],
  },
  {
    method: 'put', label: '/api/rider/unit-preference', path: () => '/api/rider/unit-preference', valid: () => ({ unit: 'in' }),
    missing: ['unit'], long: [['unit', 'i'.repeat(500)]], wrongType: [['unit', 1]], sqlLike: [['unit', SQL]], scriptLike: [['unit', SCRIPT]],
  },
  {
    method: 'post', label: '/api/rider/bikes', path: () => '/api/rider/bikes', valid: () => bikeBody(),
    missing: ['name', 'kind', 'baseline', 'baseline.setup', 'baseline.setup.saddleHeight', 'baseline.takenOn', 'baseline.unit'],
    long: [['name', 'n'.repeat(61)], ['notes', 'n'.repeat(501)], ['baseline.cleatNotes', 'c'.repeat(501)]],
    wrongType: [['name', 5], ['baseline.setup.crankLength', '172.5'], ['baseline.setup', []], ['baseline.takenOn', 20260101]],
    sqlLike: [['kind', SQL], ['baseline.takenOn', SQL], ['baseline.setup.reach', SQL]],
    scriptLike: [['name', SCRIPT], ['baseline.cleatNotes', SCRIPT]],
  },
  {
    method: 'patch', label: '/api/rider/bikes/:id', path: () => `/api/rider/bikes/${bikeId}`, valid: () => ({ name: 'Renamed', kind: 'gravel' }),
    missing: [], long: [['name', 'n'.repeat(61)]], wrongType: [['kind', ['road']], ['notes', {}]], sqlLike: [['kind', SQL]], scriptLike: [['name', SCRIPT], ['notes', '<img src=x onerror=alert(1)>']],
  },
  {
    method: 'post', label: '/api/rider/bikes/:id/snapshots', path: () => `/api/rider/bikes/${bikeId}/snapshots`, valid: snapshot,
    missing: ['setup', 'takenOn', 'setup.drop'], long: [['cleatNotes', 'c'.repeat(501)]],
    wrongType: [['setup.saddleTilt', null], ['unit', 25.4]], sqlLike: [['takenOn', SQL], ['setup.stack', SQL]], scriptLike: [['cleatNotes', SCRIPT]],
  },
  {
    method: 'put', label: '/api/rider/intake/draft', path: () => '/api/rider/intake/draft', valid: () => ({ symptoms: [{ region: 'knee-front-left', pain: 3 }], goals: ['ride-longer'] }),
    missing: ['symptoms.0.region'], long: [['goalNotes', 'g'.repeat(1001)], ['symptoms', Array.from({ length: 31 }, () => ({ region: 'neck' }))]],
    wrongType: [['symptoms', 'knee'], ['symptoms.0.pain', '3'], ['symptoms.0.pain', 11], ['redFlagAnswers', ['leg-weakness']], ['bikeId', 'one']],
    sqlLike: [['symptoms.0.region', SQL], ['goals.0', SQL], ['bikeId', SQL]], scriptLike: [['goalNotes', SCRIPT]],
  },
  {
    method: 'post', label: '/api/rider/intake/submit', path: () => '/api/rider/intake/submit', valid: () => submitBody(),
    missing: ['goals', 'consent', 'symptoms.0.pain', 'symptoms.0.kind', 'symptoms.0.durationDays', 'consent.version'],
    long: [['goalNotes', 'g'.repeat(1001)], ['consent.version', 'v'.repeat(21)]],
    wrongType: [['symptoms.0.timing', 'during-ride'], ['consent.agreed', 'yes'], ['redFlagAnswers.leg-weakness', 'no'], ['symptoms.0.afterCrash', 0]],
    sqlLike: [['symptoms.0.kind', SQL], ['redFlagAnswers', { [SQL]: true }], ['consent.kind', SQL]], scriptLike: [['goalNotes', SCRIPT]],
  },
];

function setPath(body: Record<string, unknown>, path: string, value: unknown): Record<string, unknown> {
  const keys = path.split('.');
  let node = body as Record<string, unknown>;
  for (const key of keys.slice(0, -1)) node = node[key] as Record<string, unknown>;
  const last = keys.at(-1)!;
  if (value === undefined) delete node[last];
  else node[last] = value;
  return body;
}

function send(route: Route, raw: string) {
  return rider.agent[route.method](route.path()).set('X-CSRF-Token', rider.csrfToken).set('Content-Type', 'application/json').send(raw);
}

async function expectRefused(route: Route, raw: string, status = 400) {
  const before = await stored();
  const res = await send(route, raw);
  expect(res.status).toBe(status);
  expect(res.body.error.message).toEqual(expect.any(String));
  expect(res.body.error.message.length).toBeGreaterThan(10);
  expect(JSON.stringify(res.body)).not.toMatch(/sequelize|SqlError|"stack"|at \w+ \(|Invalid input: expected/i);
  expect(await stored()).toEqual(before);
  return res;
}

for (const route of ROUTES) {
  describe(`bad input to ${route.method.toUpperCase()} ${route.label}`, () => {
    it('accepts the valid body (the baseline for the cases below)', async () => {
      const res = await send(route, JSON.stringify(route.valid()));
      expect([200, 201]).toContain(res.status);
    });

    it('answers malformed JSON with 400 malformed_json', async () => {
      const res = await expectRefused(route, '{"unit": "mm",');
      expect(res.body.error.code).toBe('malformed_json');
    });

    it.each([['an array', '[]'], ['a number', '42'], ['null', 'null'], ['a string', '"hello"']])('refuses %s as the body', async (_label, raw) => {
      await expectRefused(route, raw);
    });

    it('refuses an extra field by name', async () => {
      const res = await expectRefused(route, JSON.stringify({ ...route.valid(), riderId: 1 }));
      expect(res.body.error.message).toMatch(/Unexpected field: riderId/);
    });

    const cases: [string, string, unknown][] = [
      ...route.missing.map((f): [string, string, unknown] => ['missing', f, undefined]),
      ...route.long.map(([f, v]): [string, string, unknown] => ['over-long', f, v]),
      ...route.wrongType.map(([f, v]): [string, string, unknown] => ['wrong type', f, v]),
      ...route.sqlLike.map(([f, v]): [string, string, unknown] => ['SQL-like', f, v]),
      ...route.scriptLike.map(([f, v]): [string, string, unknown] => ['script-like', f, v]),
    ];
    it.each(cases)('refuses a %s %s with 400 naming the field', async (_kind, field, value) => {
      const res = await expectRefused(route, JSON.stringify(setPath(route.valid(), field, value)));
      expect(res.body.error.code).toBe('validation_failed');
      const named = Object.keys(res.body.error.fields ?? {});
      expect(named.some((f) => f === field || field.startsWith(`${f}.`) || f.startsWith(`${field}.`) || f === field.split('.').slice(0, -1).join('.'))).toBe(true);
    });
  });
}

describe('free text is stored as typed, never run', () => {
  it('keeps SQL-like injury notes verbatim as plain text', async () => {
    const injuryHistory = "Knee op in 2019; my physio said \"don't rush\" -- OR 1=1; DROP TABLE users;";
    const res = await rider.put('/api/rider/profile', { unit: 'mm', injuryHistory }).expect(200);
    expect(res.body.profile.injuryHistory).toBe(injuryHistory);
    expect((await RiderProfile.findByPk(rider.user.id))?.injuryHistory).toBe(injuryHistory);
  });

  it('allows a plain "<" in text that is not markup', async () => {
    await rider.put('/api/rider/profile', { unit: 'mm', injuryHistory: 'Pain < 2 weeks, then <5/10' }).expect(200);
  });
});

describe('ids in paths', () => {
  it.each(['abc', '0', '-3', '1.5', '99999999999'])('answers 404 for bike id %s', async (id) => {
    await rider.get(`/api/rider/bikes/${id}`).expect(404);
    await rider.patch(`/api/rider/bikes/${id}`, { name: 'x' }).expect(404);
  });

  it('answers 404 for a consent id that is not the rider\'s', async () => {
    const res = await rider.post('/api/rider/consents/4294967295/withdraw');
    expect(res.status).toBe(404);
  });
});
