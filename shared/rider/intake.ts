/**
 * "Tell us what hurts": body-map symptoms, the red-flag screen, riding goals and consent.
 * A draft validates loosely (symptoms may be half filled in) so the rider can stop at any time;
 * submission validates strictly. The triage is always computed by the server from these answers.
 */
import { z } from 'zod';
import {
  BODY_REGIONS, PAIN_KINDS, PAIN_TIMINGS, RED_FLAG_IDS, RED_FLAG_QUESTIONS, REFERRAL_LEVELS,
  redFlagTriggerSchema, type RedFlagId, type Symptom,
} from '../fit/triage';
import { idSchema, plainText, strictShape } from './text';

export const RIDING_GOALS = ['ride-without-pain', 'ride-longer', 'more-comfort', 'more-power', 'event', 'new-bike'] as const;
export type RidingGoal = (typeof RIDING_GOALS)[number];
export const RIDING_GOAL_LABELS: Record<RidingGoal, string> = {
  'ride-without-pain': 'Ride without pain',
  'ride-longer': 'Ride longer distances',
  'more-comfort': 'Feel more comfortable on the bike',
  'more-power': 'Pedal more efficiently',
  event: 'Get ready for an event',
  'new-bike': 'Set up a new bike well',
};

/** Plain choices for "how long has it lasted", stored as days (the symptom schema's unit). */
export const DURATION_CHOICES = [
  { days: 2, label: 'A day or two' },
  { days: 7, label: 'About a week' },
  { days: 21, label: 'A few weeks' },
  { days: 60, label: 'One to three months' },
  { days: 180, label: 'Three months to a year' },
  { days: 730, label: 'More than a year' },
] as const;

export const INTAKE_LIMITS = { goalNotesMax: 1000, goalsMax: RIDING_GOALS.length, symptomsMax: BODY_REGIONS.length } as const;

/**
 * Questions that only matter after a crash or fall (the Ottawa knee rules and age): the intake
 * asks them only then, so riders without a crash are not asked about X-ray signs.
 */
export const CRASH_FOLLOW_UP_IDS = ['age-55-or-over', 'kneecap-tender', 'fibular-head-tender', 'cannot-bend-knee-90', 'cannot-take-four-steps'] as const satisfies readonly RedFlagId[];

/** The red-flag questions to show, in order, given the answers and symptoms so far. */
export function questionsToAsk(answers: Partial<Record<RedFlagId, boolean>>, symptoms: readonly { afterCrash?: boolean }[]): RedFlagId[] {
  const crash = answers['crash-or-fall'] === true || symptoms.some((s) => s.afterCrash === true);
  const followUps: readonly RedFlagId[] = CRASH_FOLLOW_UP_IDS;
  return RED_FLAG_QUESTIONS.map((q) => q.id).filter((id) => crash || !followUps.includes(id));
}

const region = z.enum(BODY_REGIONS, { error: 'Choose a body area from the map.' });
const pain = z.number({ error: 'Set the pain from 0 to 10.' }).int('Pain is a whole number from 0 to 10.').min(0, 'Pain is from 0 to 10.').max(10, 'Pain is from 0 to 10.');
const kind = z.enum(PAIN_KINDS, { error: 'Choose what the pain feels like.' });
const timing = z
  .array(z.enum(PAIN_TIMINGS, { error: 'Choose when it hurts from the list.' }), { error: 'Say when it hurts.' })
  .max(PAIN_TIMINGS.length, 'Choose each time only once.')
  .refine((t) => new Set(t).size === t.length, 'Choose each time only once.');
const durationDays = z.number({ error: 'Say how long it has lasted.' }).int('Say how long it has lasted in whole days.').min(0, 'Say how long it has lasted.').max(36_500, 'Say how long it has lasted (at most 100 years).');
const yesNo = z.boolean({ error: 'Answer yes or no.' });

/** A half-filled body-map entry: only the region is needed. */
export const symptomDraftSchema = strictShape({
  region,
  pain: pain.optional(),
  kind: kind.optional(),
  timing: timing.default([]),
  durationDays: durationDays.optional(),
  numbness: yesNo.optional(),
  swelling: yesNo.optional(),
  afterCrash: yesNo.optional(),
});
export type SymptomDraft = z.infer<typeof symptomDraftSchema>;

/** A complete entry, with our messages; its output is exactly the triage's `Symptom`. */
export const symptomSubmitSchema = strictShape({
  region,
  pain,
  kind,
  timing: timing.min(1, 'Say when it hurts.'),
  durationDays,
  numbness: yesNo.default(false),
  swelling: yesNo.default(false),
  afterCrash: yesNo.default(false),
});
// Compile-time proof that a submitted symptom is what the shared triage reads.
const _sameAsTriage = (s: z.output<typeof symptomSubmitSchema>): Symptom => s;
void _sameAsTriage;

function uniqueRegions(list: readonly { region: string }[]): boolean {
  return new Set(list.map((s) => s.region)).size === list.length;
}

const answers = z.partialRecord(z.enum(RED_FLAG_IDS), yesNo, {
  // Unknown keys arrive as `unrecognized_keys` at run time, though the record's issue type omits it.
  error: (issue) => ((issue.code as string) === 'unrecognized_keys' ? `Unknown safety question: ${(issue as { keys?: string[] }).keys?.join(', ')}.` : 'Send the safety answers as yes or no per question.'),
});
const goals = z
  .array(z.enum(RIDING_GOALS, { error: 'Choose goals from the list.' }), { error: 'Choose goals from the list.' })
  .max(INTAKE_LIMITS.goalsMax, 'Choose each goal only once.')
  .refine((g) => new Set(g).size === g.length, 'Choose each goal only once.');
const goalNotes = plainText('notes on your goals', INTAKE_LIMITS.goalNotesMax).default('');
const bikeId = idSchema.nullable().default(null);

/** PUT /api/rider/intake/draft: everything optional, symptoms may be incomplete. */
export const intakeDraftSchema = strictShape({
  symptoms: z.array(symptomDraftSchema, { error: 'Send the symptoms as a list.' }).max(INTAKE_LIMITS.symptomsMax, 'Too many body areas.').refine(uniqueRegions, 'Each body area can be marked only once.').default([]),
  redFlagAnswers: answers.default({}),
  goals: goals.default([]),
  goalNotes,
  bikeId,
});
export type IntakeDraftInput = z.input<typeof intakeDraftSchema>;
export type IntakeDraftParsed = z.output<typeof intakeDraftSchema>;

export const consentAgreementSchema = strictShape({
  kind: z.literal('store-health-data', { error: 'This consent must be to store health data.' }),
  version: z.string({ error: 'Say which consent version you read.' }).max(20, 'Unknown consent version.'),
  agreed: z.literal(true, { error: 'Please tick the box to agree to us storing your health information.' }),
});

/** POST /api/rider/intake/submit: complete answers plus the consent. */
export const intakeSubmitSchema = strictShape({
  symptoms: z.array(symptomSubmitSchema, { error: 'Send the symptoms as a list.' }).max(INTAKE_LIMITS.symptomsMax, 'Too many body areas.').refine(uniqueRegions, 'Each body area can be marked only once.').default([]),
  redFlagAnswers: answers.default({}),
  goals: goals.min(1, 'Choose at least one riding goal.'),
  goalNotes,
  bikeId,
  consent: z.unknown().transform((v, ctx) => {
    if (v === undefined || v === null) {
      ctx.addIssue({ code: 'custom', message: 'Please tick the box to agree to us storing your health information.' });
      return z.NEVER;
    }
    return v;
  }).pipe(consentAgreementSchema),
}).superRefine((value, ctx) => {
  const missing = questionsToAsk(value.redFlagAnswers, value.symptoms).filter((id) => typeof value.redFlagAnswers[id] !== 'boolean');
  for (const id of missing) {
    ctx.addIssue({ code: 'custom', path: ['redFlagAnswers', id], message: `Please answer every safety question (${missing.length} left).` });
  }
});
export type IntakeSubmitInput = z.input<typeof intakeSubmitSchema>;
export type IntakeSubmitParsed = z.output<typeof intakeSubmitSchema>;

export const INTAKE_STATUSES = ['draft', 'submitted'] as const;

export const rankedCauseViewSchema = z.object({ cause: z.string(), text: z.string(), score: z.number(), sources: z.array(z.string()) });

export const triageViewSchema = z.object({
  level: z.enum(REFERRAL_LEVELS),
  triggers: z.array(redFlagTriggerSchema),
  advice: z.string(),
  /** Possible fit causes to check: for the fitter and physio only, never shown to the rider as a finding. */
  causes: z.array(rankedCauseViewSchema).optional(),
  computedAt: z.string(),
});
export type TriageView = z.infer<typeof triageViewSchema>;

export const consentViewSchema = z.object({
  id: z.number(),
  kind: z.string(),
  version: z.string(),
  textHash: z.string(),
  givenAt: z.string(),
  withdrawnAt: z.string().nullable(),
});
export type ConsentView = z.infer<typeof consentViewSchema>;

export const intakeViewSchema = z.object({
  id: z.number(),
  riderId: z.number(),
  status: z.enum(INTAKE_STATUSES),
  symptoms: z.array(symptomDraftSchema),
  redFlagAnswers: z.partialRecord(z.enum(RED_FLAG_IDS), z.boolean()),
  goals: z.array(z.enum(RIDING_GOALS)),
  goalNotes: z.string(),
  bikeId: z.number().nullable(),
  triage: triageViewSchema.nullable(),
  consent: consentViewSchema.nullable(),
  submittedAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type IntakeView = z.infer<typeof intakeViewSchema>;

export const READINESS_CODES = ['ready', 'no-intake', 'no-consent', 'urgent'] as const;

/** GET /api/rider/booking-readiness. */
export const bookingReadinessSchema = z.object({
  ready: z.boolean(),
  code: z.enum(READINESS_CODES),
  reason: z.string().optional(),
  level: z.enum(REFERRAL_LEVELS).nullable(),
  intakeId: z.number().optional(),
  flaggedForPhysio: z.boolean(),
});
export type BookingReadiness = z.infer<typeof bookingReadinessSchema>;
