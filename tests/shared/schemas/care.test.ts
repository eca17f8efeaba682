import { describe, expect, it } from 'vitest';
import {
  CHECK_IN_NOTE_MAX, checkInFormSchema, clearHoldSchema, createReferralSchema, declineReferralSchema, physioResponseSchema,
  REFERRAL_STATUS_LABELS, REFERRAL_STATUSES, referralConsentSchema,
} from '@shared/care';
import { problems } from './problems';

const checkIn = { rides: 3, minutesRidden: 240, comfort: 7, pains: [{ region: 'knee-front-left', pain: 2 }], numbness: false };

describe('checkInFormSchema', () => {
  it('accepts a check-in, with an empty note and no red-flag answers by default', () => {
    expect(checkInFormSchema.parse(checkIn)).toEqual({ ...checkIn, note: '', redFlagAnswers: {} });
  });

  it('trims the note and keeps the red-flag answers', () => {
    const parsed = checkInFormSchema.parse({ ...checkIn, pains: [], note: '  Better on climbs.  ', redFlagAnswers: { 'leg-weakness': false } });
    expect(parsed).toMatchObject({ pains: [], note: 'Better on climbs.', redFlagAnswers: { 'leg-weakness': false } });
  });

  it('asks for each missing answer in plain words', () => {
    expect(problems(checkInFormSchema, {})).toEqual({
      rides: 'Say how many rides.',
      minutesRidden: 'Say how long you rode in total.',
      comfort: 'Rate your comfort from 0 to 10.',
      pains: 'Send pain as a list of body areas.',
      numbness: 'Say whether you had numbness.',
    });
  });

  it('keeps rides, time and comfort in range', () => {
    expect(problems(checkInFormSchema, { ...checkIn, rides: -1, minutesRidden: -5, comfort: -1 })).toEqual({
      rides: 'Rides cannot be negative.', minutesRidden: 'Time cannot be negative.', comfort: 'Comfort is from 0 to 10.',
    });
    expect(problems(checkInFormSchema, { ...checkIn, rides: 201, minutesRidden: 20_001, comfort: 11 })).toEqual({
      rides: 'At most 200 rides per check-in.', minutesRidden: 'That is more riding than a step allows.', comfort: 'Comfort is from 0 to 10.',
    });
    expect(problems(checkInFormSchema, { ...checkIn, rides: 2.5 })).toEqual({ rides: 'Rides are a whole number.' });
  });

  it('refuses the same body area twice, too many areas and pain off the scale', () => {
    expect(problems(checkInFormSchema, { ...checkIn, pains: [{ region: 'neck', pain: 1 }, { region: 'neck', pain: 2 }] })).toEqual({ pains: 'Each body area can be marked only once.' });
    const many = Array.from({ length: 31 }, () => ({ region: 'neck', pain: 1 }));
    expect(problems(checkInFormSchema, { ...checkIn, pains: many })).toMatchObject({ pains: 'Too many body areas.' });
    expect(problems(checkInFormSchema, { ...checkIn, pains: [{ region: 'neck', pain: 2.5 }] })).toEqual({ 'pains.0.pain': 'Pain is a whole number from 0 to 10.' });
    expect(checkInFormSchema.safeParse({ ...checkIn, pains: [{ region: 'neck', pain: 11 }] }).success).toBe(false);
    expect(checkInFormSchema.safeParse({ ...checkIn, pains: [{ region: 'elbow', pain: 1 }] }).success).toBe(false);
  });

  it('refuses a note with < or > or over the limit', () => {
    expect(problems(checkInFormSchema, { ...checkIn, note: '<script>' })).toEqual({ note: 'The note cannot contain < or >.' });
    expect(problems(checkInFormSchema, { ...checkIn, note: 'x'.repeat(CHECK_IN_NOTE_MAX + 1) })).toEqual({ note: 'Keep the note under 2000 characters.' });
  });

  it('refuses unknown red-flag questions and extra fields', () => {
    expect(checkInFormSchema.safeParse({ ...checkIn, redFlagAnswers: { 'made-up': true } }).success).toBe(false);
    expect(checkInFormSchema.safeParse({ ...checkIn, stepId: 4 }).success).toBe(false);
  });
});

describe('createReferralSchema', () => {
  it('fills empty findings and no attachments, trimming the reason', () => {
    expect(createReferralSchema.parse({ urgency: 'soon', reason: '  Knee pain at night.  ' })).toEqual({
      urgency: 'soon', reason: 'Knee pain at night.', findings: '', attachmentIds: [],
    });
  });

  it('keeps findings, attachments and a chosen physio', () => {
    const parsed = createReferralSchema.parse({ urgency: 'routine', reason: 'r', findings: ' Valgus at 6 o’clock. ', attachmentIds: [3, 4], physioId: 9 });
    expect(parsed).toEqual({ urgency: 'routine', reason: 'r', findings: 'Valgus at 6 o’clock.', attachmentIds: [3, 4], physioId: 9 });
  });

  it('needs an urgency and a reason', () => {
    expect(problems(createReferralSchema, {})).toEqual({ urgency: 'Choose routine, soon or urgent.', reason: 'Write the reason.' });
    expect(problems(createReferralSchema, { urgency: 'whenever', reason: '   ' })).toEqual({ urgency: 'Choose routine, soon or urgent.', reason: 'Write the reason.' });
  });

  it('refuses over-long or script-like text', () => {
    expect(problems(createReferralSchema, { urgency: 'soon', reason: 'x'.repeat(1001), findings: 'x'.repeat(4001) })).toEqual({
      reason: 'Keep the reason under 1000 characters.', findings: 'Keep the findings under 4000 characters.',
    });
    expect(problems(createReferralSchema, { urgency: 'soon', reason: 'a > b', findings: '<b>' })).toEqual({
      reason: 'The reason cannot contain < or >.', findings: 'The findings cannot contain < or >.',
    });
  });

  it('shares at most 12 files, each a real id', () => {
    expect(problems(createReferralSchema, { urgency: 'soon', reason: 'r', attachmentIds: Array.from({ length: 13 }, (_, i) => i + 1) })).toEqual({ attachmentIds: 'Share at most 12 files.' });
    expect(createReferralSchema.safeParse({ urgency: 'soon', reason: 'r', attachmentIds: [0] }).success).toBe(false);
    expect(createReferralSchema.safeParse({ urgency: 'soon', reason: 'r', physioId: -1 }).success).toBe(false);
  });
});

describe('referralConsentSchema and declineReferralSchema', () => {
  it('accept a ticked consent to share with the physio', () => {
    expect(referralConsentSchema.parse({ version: '2026-12-02', agreed: true })).toEqual({ version: '2026-12-02', agreed: true });
  });

  it('ask for the tick when it is missing or false', () => {
    const message = 'Please tick the box to agree to share your information with the physiotherapist.';
    expect(problems(referralConsentSchema, { version: '2026-12-02', agreed: false })).toEqual({ agreed: message });
    expect(problems(referralConsentSchema, { version: '2026-12-02' })).toEqual({ agreed: message });
  });

  it('need a short reason for declining', () => {
    expect(declineReferralSchema.parse({ note: ' Not my field. ' })).toEqual({ note: 'Not my field.' });
    expect(problems(declineReferralSchema, { note: '' })).toEqual({ note: 'Write the reason for declining.' });
    expect(problems(declineReferralSchema, {})).toEqual({ note: 'Write the reason for declining.' });
  });
});

describe('physioResponseSchema', () => {
  it('accepts a plain "continue" with a trimmed note', () => {
    expect(physioResponseSchema.parse({ note: '  Fine to go on.  ', decision: 'continue' })).toEqual({ note: 'Fine to go on.', decision: 'continue' });
  });

  it('needs limits for "continue with limits" and fills their defaults', () => {
    expect(problems(physioResponseSchema, { note: 'n', decision: 'continue_with_limits' })).toEqual({ limits: 'Set the limits the plan must keep.' });
    const parsed = physioResponseSchema.parse({ note: 'n', decision: 'continue_with_limits', limits: { excludedGroups: ['cleats'], capFactor: 0.5 } });
    expect(parsed.limits).toEqual({ excludedParameters: [], excludedGroups: ['cleats'], stepCaps: {}, capFactor: 0.5 });
  });

  it('does not let the limits put a hold, clear red flags or carry their own note', () => {
    for (const key of ['hold', 'clearedRedFlags', 'note']) {
      expect(physioResponseSchema.safeParse({ note: 'n', decision: 'continue_with_limits', limits: { [key]: true } }).success).toBe(false);
    }
  });

  it('needs a reason for a hold, blank after trimming counts as none', () => {
    const message = 'Say why the plan is on hold; the rider and fitter will see it.';
    expect(problems(physioResponseSchema, { note: 'n', decision: 'hold' })).toEqual({ holdReason: message });
    expect(problems(physioResponseSchema, { note: 'n', decision: 'hold', holdReason: '   ' })).toEqual({ holdReason: message });
    expect(physioResponseSchema.parse({ note: 'n', decision: 'hold', holdReason: ' Scan first. ' }).holdReason).toBe('Scan first.');
  });

  it('needs a clinical note and a known decision', () => {
    expect(problems(physioResponseSchema, { decision: 'maybe' })).toEqual({
      note: 'Write the clinical note.', decision: 'Choose continue, continue with limits, or hold the plan.',
    });
    expect(problems(physioResponseSchema, { note: '<i>', decision: 'continue' })).toEqual({ note: 'The clinical note cannot contain < or >.' });
    expect(problems(physioResponseSchema, { note: 'x'.repeat(4001), decision: 'continue' })).toEqual({ note: 'Keep the clinical note under 4000 characters.' });
  });
});

describe('clearHoldSchema and referral labels', () => {
  it('need a note to clear a hold', () => {
    expect(clearHoldSchema.parse({ note: ' Scan clear. ' })).toEqual({ note: 'Scan clear.' });
    expect(problems(clearHoldSchema, { note: ' ' })).toEqual({ note: 'Write the note.' });
  });

  it('label every referral status', () => {
    expect(Object.keys(REFERRAL_STATUS_LABELS)).toEqual([...REFERRAL_STATUSES]);
  });
});

describe('fixes from the schema review', () => {
  it('refuses a repeated pain timing, limits outside continue-with-limits, and markup in a hold reason', async () => {
    const { symptomSubmitSchema } = await import('@shared/rider');
    const { physioResponseSchema } = await import('@shared/care');
    expect(symptomSubmitSchema.safeParse({ region: 'neck', pain: 2, kind: 'ache', timing: ['during-ride', 'during-ride'], durationDays: 3 }).success).toBe(false);
    expect(physioResponseSchema.safeParse({ note: 'ok', decision: 'continue', limits: { capFactor: 0.5 } }).success).toBe(false);
    expect(physioResponseSchema.safeParse({ note: 'ok', decision: 'hold', holdReason: '<b>x</b>' }).success).toBe(false);
  });

  it('accepts the calendar date of the most advanced time zone as today', async () => {
    const { latestTodayAnywhere } = await import('@shared/rider');
    expect(latestTodayAnywhere(Date.parse('2026-12-02T11:00:00Z'))).toBe('2026-12-03');
    expect(latestTodayAnywhere(Date.parse('2026-12-02T09:00:00Z'))).toBe('2026-12-02');
  });

  it('gives each parse of the clinic settings its own nested defaults', async () => {
    const { clinicSettingsSchema } = await import('@shared/clinic');
    const a = clinicSettingsSchema.parse({});
    const b = clinicSettingsSchema.parse({});
    expect(a.planner.stepCaps).not.toBe(b.planner.stepCaps);
  });
});
