import { describe, expect, it } from 'vitest';
import { cancelSchema, fitterSettingsSchema, holdSlotSchema, paymentSchema, rescheduleSchema, slotRangeSchema, TEST_CARDS } from '@shared/booking';
import { applyStepSchema, NOTE_MAX_CHARS, noteSchema, planInputsQuerySchema, revertSchema, saveMeasurementSchema, sendPlanSchema } from '@shared/plan';
import { problems } from './problems';

const target = { saddleHeight: 745, saddleSetback: 60, saddleTilt: 0, reach: 500, drop: 80, stemLength: 100, spacerStack: 20, crankLength: 170, stack: 20, cleatForeAft: 0, cleatRotation: 0 };

describe('sendPlanSchema', () => {
  it('accepts a bike, a target in millimetres, an optional start date and the previewed plan', () => {
    const plan = { status: 'reaches-target', steps: [] };
    expect(sendPlanSchema.parse({ bikeId: 3, target, plan })).toEqual({ bikeId: 3, target, plan });
    expect(sendPlanSchema.parse({ bikeId: 3, target, plan, startDate: '2027-03-01' }).startDate).toBe('2027-03-01');
  });

  it.each([undefined, null, 'plan', 7])('asks for the previewed plan when it is %j', (plan) => {
    expect(problems(sendPlanSchema, { bikeId: 3, target, plan })).toEqual({ plan: 'Send the previewed plan.' });
  });

  it('asks which bike, and checks the target against the plausibility limits', () => {
    expect(problems(sendPlanSchema, { target: { ...target, saddleHeight: 1200 }, plan: {} })).toEqual({
      bikeId: 'Say which bike.',
      'target.saddleHeight': 'The saddle height must be at most 1100 mm.',
    });
  });

  it('refuses a start date that does not exist', () => {
    expect(problems(sendPlanSchema, { bikeId: 3, target, plan: {}, startDate: '2027-02-29' })).toEqual({ startDate: 'That date does not exist.' });
  });
});

describe('planInputsQuerySchema', () => {
  it('reads the bike id from the query string', () => {
    expect(planInputsQuerySchema.parse({ bikeId: '7' })).toEqual({ bikeId: 7 });
  });

  it('refuses a bike id that is not a positive whole number', () => {
    expect(problems(planInputsQuerySchema, { bikeId: 'blue' })).toEqual({ bikeId: 'Say which bike.' });
    for (const bikeId of ['0', '-2', '1.5', '4294967296']) expect(planInputsQuerySchema.safeParse({ bikeId }).success).toBe(false);
  });
});

describe('applyStepSchema and revertSchema', () => {
  it('take the day a step was made', () => {
    expect(applyStepSchema.parse({ appliedOn: '2027-03-05' })).toEqual({ appliedOn: '2027-03-05' });
    expect(problems(applyStepSchema, { appliedOn: '5 March' })).toEqual({ appliedOn: 'Use a date like 2025-03-01.' });
    expect(problems(applyStepSchema, { appliedOn: '2027-13-01' })).toEqual({ appliedOn: 'That date does not exist.' });
  });

  it('take the earlier setup to go back to', () => {
    expect(revertSchema.parse({ snapshotId: 12 })).toEqual({ snapshotId: 12 });
    expect(problems(revertSchema, {})).toEqual({ snapshotId: 'Say which earlier setup.' });
    expect(revertSchema.safeParse({ snapshotId: 0 }).success).toBe(false);
  });
});

describe('noteSchema', () => {
  it('trims a private note', () => {
    expect(noteSchema.parse({ body: '  Check cleat wear next time.  ' })).toEqual({ body: 'Check cleat wear next time.' });
  });

  it('refuses an empty, missing or over-long note', () => {
    expect(problems(noteSchema, { body: '   ' })).toEqual({ body: 'Write the note.' });
    expect(problems(noteSchema, {})).toEqual({ body: 'Write the note.' });
    expect(problems(noteSchema, { body: 'x'.repeat(NOTE_MAX_CHARS + 1) })).toEqual({ body: 'A note can be at most 5000 characters.' });
  });
});

describe('saveMeasurementSchema', () => {
  it('keeps the marked points and fills the click precision', () => {
    const input = { points: { hip: { x: 10, y: 20 }, knee: { x: 30, y: 60 } }, facing: 'right' };
    expect(saveMeasurementSchema.parse({ consultationId: 4, input })).toEqual({ consultationId: 4, input: { ...input, clickPrecisionPx: 2 } });
  });

  it('asks which consultation and refuses a bad facing', () => {
    expect(problems(saveMeasurementSchema, { input: { points: {}, facing: 'left' } })).toEqual({ consultationId: 'Say which consultation.' });
    expect(saveMeasurementSchema.safeParse({ consultationId: 4, input: { points: {}, facing: 'up' } }).success).toBe(false);
  });
});

describe('holdSlotSchema and rescheduleSchema', () => {
  it('turn an ISO time with an offset into an instant', () => {
    const parsed = holdSlotSchema.parse({ fitterId: 2, startsAt: '2027-03-09T09:00:00+01:00' });
    expect(parsed.fitterId).toBe(2);
    expect(parsed.startsAt).toBeInstanceOf(Date);
    expect(parsed.startsAt.toISOString()).toBe('2027-03-09T08:00:00.000Z');
    expect(rescheduleSchema.parse({ startsAt: '2027-03-09T08:00:00Z' }).startsAt.getTime()).toBe(Date.UTC(2027, 2, 9, 8));
  });

  it('refuses a missing fitter and a time without a zone', () => {
    expect(problems(holdSlotSchema, { startsAt: '2027-03-09 08:00' })).toEqual({
      fitterId: 'Choose a fitter.',
      startsAt: 'Send the time as an ISO date-time, like 2027-03-09T08:00:00Z.',
    });
    expect(problems(rescheduleSchema, { startsAt: '2027-03-09T08:00:00' })).toEqual({ startsAt: 'Send the time as an ISO date-time, like 2027-03-09T08:00:00Z.' });
    expect(holdSlotSchema.safeParse({ fitterId: 0, startsAt: '2027-03-09T08:00:00Z' }).success).toBe(false);
  });
});

describe('paymentSchema', () => {
  const attemptKey = '0d6f2c1e-5b4a-4c3d-8e2f-1a2b3c4d5e6f';

  it.each(TEST_CARDS.map((c) => c.token))('accepts the test card %s', (token) => {
    expect(paymentSchema.parse({ token, attemptKey })).toEqual({ token, attemptKey });
  });

  it('refuses card tokens that are not Stripe tokens', () => {
    for (const token of ['visa', 'tok_', 'tok_a-b', `tok_${'a'.repeat(97)}`]) {
      expect(problems(paymentSchema, { token, attemptKey })).toEqual({ token: 'That card token is not valid.' });
    }
    expect(problems(paymentSchema, { attemptKey })).toEqual({ token: 'Choose a card.' });
  });

  it('needs the attempt id that keeps a double click from paying twice', () => {
    expect(problems(paymentSchema, { token: 'tok_visa', attemptKey: 'attempt-1' })).toEqual({ attemptKey: 'Missing payment attempt id; reload the page.' });
  });
});

describe('cancelSchema', () => {
  it('takes an optional, trimmed reason', () => {
    expect(cancelSchema.parse({})).toEqual({});
    expect(cancelSchema.parse({ reason: '  Ill.  ' })).toEqual({ reason: 'Ill.' });
    expect(problems(cancelSchema, { reason: 'x'.repeat(501) })).toEqual({ reason: 'Keep the reason under 500 characters.' });
  });
});

describe('slotRangeSchema', () => {
  it('accepts a range of one or more days', () => {
    expect(slotRangeSchema.parse({ from: '2027-03-09', to: '2027-03-09' })).toEqual({ from: '2027-03-09', to: '2027-03-09' });
    expect(slotRangeSchema.parse({ from: '2027-03-09', to: '2027-04-01' }).to).toBe('2027-04-01');
  });

  it('refuses an end before the start, and dates that do not exist', () => {
    expect(problems(slotRangeSchema, { from: '2027-03-10', to: '2027-03-09' })).toEqual({ to: 'The end date must not be before the start date.' });
    expect(problems(slotRangeSchema, { from: '2027-02-30', to: '2027-03-09' })).toEqual({ from: 'That date does not exist.' });
  });
});

describe('fitterSettingsSchema', () => {
  const profile = { bio: ' Fitter since 2010. ', specialties: ['knees'], languages: ['English'], feeMinor: 9000, currency: 'EUR', timeZone: 'Europe/Oslo', published: true };
  const availability = { windows: [{ weekday: 1, start: '09:00', end: '12:30' }], exceptions: [], slotMinutes: 60, bufferMinutes: 15, minNoticeHours: 24 };

  it('takes a profile and a week of availability, times as minutes after midnight', () => {
    const parsed = fitterSettingsSchema.parse({ profile, availability });
    expect(parsed.profile.bio).toBe('Fitter since 2010.');
    expect(parsed.availability.windows).toEqual([{ weekday: 1, start: 540, end: 750 }]);
    expect(parsed.availability.horizonDays).toBe(42);
  });

  it('refuses a profile without a language and a window that ends before it starts', () => {
    expect(problems(fitterSettingsSchema, { profile: { ...profile, languages: [] }, availability: { ...availability, windows: [{ weekday: 1, start: '12:00', end: '09:00' }] } })).toEqual({
      'profile.languages': 'Add at least one language.',
      'availability.windows.0.end': 'A window must end after it starts.',
    });
    expect(fitterSettingsSchema.safeParse({ profile }).success).toBe(false);
  });
});
