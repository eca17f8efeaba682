import { describe, expect, it } from 'vitest';
import { RED_FLAG_QUESTIONS, type RedFlagId } from '@shared/fit/triage';
import {
  bookingReadinessSchema, CRASH_FOLLOW_UP_IDS, DURATION_CHOICES, INTAKE_LIMITS, intakeDraftSchema, intakeSubmitSchema, intakeViewSchema,
  questionsToAsk, RIDING_GOAL_LABELS, RIDING_GOALS, symptomDraftSchema, symptomSubmitSchema,
} from '@shared/rider';
import { messages, problems } from './problems';

const ALL_IDS = RED_FLAG_QUESTIONS.map((q) => q.id);
const WITHOUT_CRASH = ALL_IDS.filter((id) => !(CRASH_FOLLOW_UP_IDS as readonly string[]).includes(id));
const answerAll = (ids: readonly RedFlagId[], value = false) => Object.fromEntries(ids.map((id) => [id, value])) as Partial<Record<RedFlagId, boolean>>;

const knee = { region: 'knee-front-left', pain: 4, kind: 'ache', timing: ['during-ride'], durationDays: 21 };
const consent = { kind: 'store-health-data', version: '2026-12-01', agreed: true };
const submission = { symptoms: [knee], redFlagAnswers: answerAll(WITHOUT_CRASH), goals: ['ride-without-pain'], consent };

describe('questionsToAsk', () => {
  it('leaves out the crash follow-ups when there was no crash', () => {
    const asked = questionsToAsk({}, [symptomSubmitSchema.parse(knee)]);
    expect(asked).toEqual(WITHOUT_CRASH);
    for (const id of CRASH_FOLLOW_UP_IDS) expect(asked).not.toContain(id);
    expect(questionsToAsk({ 'crash-or-fall': false }, [])).toEqual(WITHOUT_CRASH);
  });

  it('adds the crash follow-ups, in order, when the rider says there was a crash', () => {
    expect(questionsToAsk({ 'crash-or-fall': true }, [])).toEqual(ALL_IDS);
  });

  it('adds the crash follow-ups when a symptom started after a crash', () => {
    expect(questionsToAsk({}, [{ afterCrash: false }, { afterCrash: true }])).toEqual(ALL_IDS);
    expect(questionsToAsk({}, [{}, { afterCrash: false }])).toEqual(WITHOUT_CRASH);
  });
});

describe('symptomDraftSchema', () => {
  it('needs only a body area and fills the timing with an empty list', () => {
    expect(symptomDraftSchema.parse({ region: 'neck' })).toEqual({ region: 'neck', timing: [] });
  });

  it('still checks whatever has been filled in', () => {
    expect(problems(symptomDraftSchema, { region: 'elbow', pain: 'bad', timing: ['daily'], durationDays: 1.5 })).toEqual({
      region: 'Choose a body area from the map.',
      pain: 'Set the pain from 0 to 10.',
      'timing.0': 'Choose when it hurts from the list.',
      durationDays: 'Say how long it has lasted in whole days.',
    });
    expect(problems(symptomDraftSchema, { region: 'neck', timing: 'at night' })).toEqual({ timing: 'Say when it hurts.' });
  });
});

describe('symptomSubmitSchema', () => {
  it('fills numbness, swelling and crash with "no"', () => {
    expect(symptomSubmitSchema.parse(knee)).toEqual({ ...knee, numbness: false, swelling: false, afterCrash: false });
  });

  it('needs every part of the entry', () => {
    expect(problems(symptomSubmitSchema, { region: 'neck' })).toEqual({
      pain: 'Set the pain from 0 to 10.',
      kind: 'Choose what the pain feels like.',
      timing: 'Say when it hurts.',
      durationDays: 'Say how long it has lasted.',
    });
    expect(problems(symptomSubmitSchema, { ...knee, timing: [] })).toEqual({ timing: 'Say when it hurts.' });
  });

  it('keeps pain a whole number from 0 to 10', () => {
    expect(symptomSubmitSchema.parse({ ...knee, pain: 0 }).pain).toBe(0);
    expect(problems(symptomSubmitSchema, { ...knee, pain: 11 })).toEqual({ pain: 'Pain is from 0 to 10.' });
    expect(problems(symptomSubmitSchema, { ...knee, pain: -1 })).toEqual({ pain: 'Pain is from 0 to 10.' });
    expect(problems(symptomSubmitSchema, { ...knee, pain: 4.5 })).toEqual({ pain: 'Pain is a whole number from 0 to 10.' });
  });

  it('keeps the duration within 0 days and 100 years', () => {
    expect(problems(symptomSubmitSchema, { ...knee, durationDays: -1 })).toEqual({ durationDays: 'Say how long it has lasted.' });
    expect(problems(symptomSubmitSchema, { ...knee, durationDays: 36_501 })).toEqual({ durationDays: 'Say how long it has lasted (at most 100 years).' });
  });

  it('refuses unknown kinds, more timings than exist and answers that are not yes or no', () => {
    expect(problems(symptomSubmitSchema, { ...knee, kind: 'itchy', numbness: 'no', timing: ['during-ride', 'after-ride', 'at-rest', 'at-night', 'at-rest'] })).toEqual({
      kind: 'Choose what the pain feels like.',
      timing: 'Choose each time only once.',
      numbness: 'Answer yes or no.',
    });
  });

  it('refuses smuggled fields', () => {
    expect(problems(symptomSubmitSchema, { ...knee, level: 'none' })).toEqual({ '': 'Unexpected field: level.' });
  });
});

describe('intakeDraftSchema', () => {
  it('turns an empty draft into empty answers', () => {
    expect(intakeDraftSchema.parse({})).toEqual({ symptoms: [], redFlagAnswers: {}, goals: [], goalNotes: '', bikeId: null });
  });

  it('keeps half-filled symptoms, answers, goals and a bike, trimming the notes', () => {
    const parsed = intakeDraftSchema.parse({
      symptoms: [{ region: 'neck', pain: 3 }], redFlagAnswers: { 'back-pain': true }, goals: ['event'], goalNotes: ' Etape in July ', bikeId: 4,
    });
    expect(parsed).toEqual({ symptoms: [{ region: 'neck', pain: 3, timing: [] }], redFlagAnswers: { 'back-pain': true }, goals: ['event'], goalNotes: 'Etape in July', bikeId: 4 });
  });

  it('refuses the same body area or goal twice', () => {
    expect(problems(intakeDraftSchema, { symptoms: [{ region: 'neck' }, { region: 'neck' }], goals: ['event', 'event'] })).toEqual({
      symptoms: 'Each body area can be marked only once.',
      goals: 'Choose each goal only once.',
    });
  });

  it('refuses more body areas or goals than exist', () => {
    const tooMany = Array.from({ length: INTAKE_LIMITS.symptomsMax + 1 }, () => ({ region: 'neck' }));
    expect(problems(intakeDraftSchema, { symptoms: tooMany })).toEqual({ symptoms: 'Too many body areas.' });
    expect(problems(intakeDraftSchema, { goals: [...RIDING_GOALS, 'event'] })).toEqual({ goals: 'Choose each goal only once.' });
  });

  it('refuses lists sent as something else, and unknown goals', () => {
    expect(problems(intakeDraftSchema, { symptoms: 'knee', goals: 'faster' })).toEqual({
      symptoms: 'Send the symptoms as a list.',
      goals: 'Choose goals from the list.',
    });
    expect(problems(intakeDraftSchema, { goals: ['win-the-tour'] })).toEqual({ 'goals.0': 'Choose goals from the list.' });
  });

  it('names unknown safety questions and refuses answers that are not yes or no', () => {
    expect(problems(intakeDraftSchema, { redFlagAnswers: { 'made-up': true, other: false } })).toEqual({ redFlagAnswers: 'Unknown safety question: made-up, other.' });
    expect(problems(intakeDraftSchema, { redFlagAnswers: { 'back-pain': 'yes' } })).toEqual({ 'redFlagAnswers.back-pain': 'Answer yes or no.' });
    expect(problems(intakeDraftSchema, { redFlagAnswers: [true] })).toEqual({ redFlagAnswers: 'Send the safety answers as yes or no per question.' });
  });

  it('refuses goal notes with markup or over the limit, and a bad bike id', () => {
    expect(problems(intakeDraftSchema, { goalNotes: '<a href=x>', bikeId: 0 })).toEqual({
      goalNotes: 'Please leave HTML tags such as <script> out of the notes on your goals.',
      bikeId: 'Expected an id number.',
    });
    expect(problems(intakeDraftSchema, { goalNotes: 'x'.repeat(INTAKE_LIMITS.goalNotesMax + 1) })).toEqual({ goalNotes: 'The notes on your goals can be at most 1000 characters.' });
  });
});

describe('intakeSubmitSchema', () => {
  it('accepts a complete intake and fills the defaults', () => {
    const parsed = intakeSubmitSchema.parse(submission);
    expect(parsed.symptoms).toEqual([{ ...knee, numbness: false, swelling: false, afterCrash: false }]);
    expect(parsed).toMatchObject({ goals: ['ride-without-pain'], goalNotes: '', bikeId: null, consent });
  });

  it('accepts an intake without symptoms', () => {
    expect(intakeSubmitSchema.parse({ ...submission, symptoms: undefined }).symptoms).toEqual([]);
  });

  it('asks for every safety question that is shown, and counts those left', () => {
    const { 'back-pain': _b, 'fever-with-pain': _f, ...rest } = answerAll(WITHOUT_CRASH);
    expect(problems(intakeSubmitSchema, { ...submission, redFlagAnswers: rest })).toEqual({
      'redFlagAnswers.fever-with-pain': 'Please answer every safety question (2 left).',
      'redFlagAnswers.back-pain': 'Please answer every safety question (2 left).',
    });
  });

  it('asks the crash follow-ups only after a crash', () => {
    const crashed = { ...submission, symptoms: [{ ...knee, afterCrash: true }] };
    const left = Object.keys(problems(intakeSubmitSchema, crashed));
    expect(left).toEqual(CRASH_FOLLOW_UP_IDS.map((id) => `redFlagAnswers.${id}`));
    expect(intakeSubmitSchema.parse({ ...crashed, redFlagAnswers: answerAll(ALL_IDS) }).symptoms[0]?.afterCrash).toBe(true);
  });

  it('needs at least one goal', () => {
    expect(problems(intakeSubmitSchema, { ...submission, goals: [] })).toEqual({ goals: 'Choose at least one riding goal.' });
  });

  it('needs complete symptoms, unlike the draft', () => {
    expect(problems(intakeSubmitSchema, { ...submission, symptoms: [{ region: 'neck' }] })).toMatchObject({ 'symptoms.0.pain': 'Set the pain from 0 to 10.' });
  });

  it.each([undefined, null])('asks for the consent tick when the consent is %s', (value) => {
    expect(problems(intakeSubmitSchema, { ...submission, consent: value })).toEqual({ consent: 'Please tick the box to agree to us storing your health information.' });
  });

  it('refuses a consent that was not agreed to, or is of another kind', () => {
    expect(problems(intakeSubmitSchema, { ...submission, consent: { ...consent, agreed: false } })).toEqual({
      'consent.agreed': 'Please tick the box to agree to us storing your health information.',
    });
    expect(messages(intakeSubmitSchema, { ...submission, consent: { kind: 'share-with-physio', version: 3, agreed: true } })).toEqual([
      'This consent must be to store health data.',
      'Say which consent version you read.',
    ]);
    expect(problems(intakeSubmitSchema, { ...submission, consent: { ...consent, version: 'v'.repeat(21) } })).toEqual({ 'consent.version': 'Unknown consent version.' });
    expect(problems(intakeSubmitSchema, { ...submission, consent: { ...consent, ip: '1.2.3.4' } })).toEqual({ consent: 'Unexpected field: ip.' });
  });
});

describe('intake and readiness views', () => {
  it('describe a submitted intake with its triage and consent', () => {
    const view = {
      id: 1, riderId: 2, status: 'submitted', symptoms: [{ region: 'neck', timing: [] }], redFlagAnswers: { 'back-pain': false }, goals: ['event'], goalNotes: '', bikeId: null,
      triage: { level: 'none', triggers: [], advice: 'ok', causes: [{ cause: 'reach', text: 't', score: 1, sources: [] }], computedAt: '2026-03-01T00:00:00Z' },
      consent: { id: 5, kind: 'store-health-data', version: '2026-12-01', textHash: 'ab', givenAt: '2026-03-01T00:00:00Z', withdrawnAt: null },
      submittedAt: '2026-03-01T00:00:00Z', createdAt: '2026-03-01T00:00:00Z', updatedAt: '2026-03-01T00:00:00Z',
    };
    expect(intakeViewSchema.parse(view)).toEqual(view);
    expect(intakeViewSchema.safeParse({ ...view, status: 'archived' }).success).toBe(false);
  });

  it('describe whether the rider may book', () => {
    expect(bookingReadinessSchema.parse({ ready: false, code: 'urgent', reason: 'See a doctor.', level: 'urgent', flaggedForPhysio: true }).code).toBe('urgent');
    expect(bookingReadinessSchema.safeParse({ ready: true, code: 'maybe', level: null, flaggedForPhysio: false }).success).toBe(false);
  });

  it('label every goal and offer durations in increasing days', () => {
    expect(Object.keys(RIDING_GOAL_LABELS)).toEqual([...RIDING_GOALS]);
    const days = DURATION_CHOICES.map((c) => c.days);
    expect(days).toEqual([...days].sort((a, b) => a - b));
  });
});
