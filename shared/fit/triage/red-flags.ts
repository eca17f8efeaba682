/**
 * Red-flag screening (TRADE §6). Levels, lowest to highest: none, physio-routine, physio-soon,
 * urgent ("stop riding and seek urgent medical care, same day").
 *
 * Our mapping of TRADE §6's physio items (a decision, see shared/README.md):
 * - soon: pain at rest or at night; swelling, locking or giving way; numbness or tingling that
 *   persists off the bike; pain ≥ 7/10; a crash or fall with any Ottawa knee sign (Stiell et al.
 *   1996 — those point to imaging). These hint at structural or nerve involvement.
 * - routine: a crash or fall without Ottawa signs; pain that has not settled after changes.
 * - two or more different physio-level findings together are raised to soon (our decision, no
 *   published rule: several findings together make a structural cause likelier).
 * - urgent (NICE NG59; BMJ Best Practice [V]): saddle/genital numbness that outlasts the ride, or
 *   saddle numbness with back pain, leg weakness or bladder/bowel change; bladder/bowel change or
 *   progressive leg weakness on their own (cauda equina signs); a hot, swollen joint; fever with pain.
 */
import { z } from 'zod';
import { parseInput } from '../errors';
import { isKneeRegion } from './regions';
import { REFERRAL_LEVELS, symptomSchema, type ReferralLevel, type Symptom } from './schemas';

const NICE = 'NICE NG59; BMJ Best Practice [V]';
const TRADE_PHYSIO = 'TRADE §6 physio referral list [V]';
const OTTAWA = 'Ottawa knee rules, Stiell et al. 1996, JAMA 275:611–615 [V]';

/**
 * The screening questions, in the order the intake shows them. `level` is the level a "yes"
 * gives on its own; `null` means the answer matters only in combination (or, for the Ottawa
 * questions, only after a crash). Ids are stable: they are stored with the answers.
 */
export const RED_FLAG_QUESTIONS = [
  { id: 'saddle-numbness-persists', level: 'urgent', source: NICE, text: 'Does numbness in the saddle or genital area last after you get off the bike?' },
  { id: 'bladder-bowel-change', level: 'urgent', source: NICE, text: 'Have you noticed any new change in controlling your bladder or bowels?' },
  { id: 'leg-weakness', level: 'urgent', source: NICE, text: 'Is either leg getting weaker, or do you trip or catch your foot more than usual?' },
  { id: 'hot-swollen-joint', level: 'urgent', source: NICE, text: 'Is any joint hot, red and swollen?' },
  { id: 'fever-with-pain', level: 'urgent', source: NICE, text: 'Do you have a fever, or feel hot and unwell, along with the pain?' },
  { id: 'saddle-numbness-riding', level: null, source: NICE, text: 'Do you get numbness in the saddle or genital area while riding?' },
  { id: 'back-pain', level: null, source: NICE, text: 'Do you have low back pain at the moment?' },
  { id: 'pain-at-rest-or-night', level: 'physio-soon', source: TRADE_PHYSIO, text: 'Does the pain come on when you are resting, or wake you at night?' },
  { id: 'swelling-locking-giving-way', level: 'physio-soon', source: TRADE_PHYSIO, text: 'Does a joint swell, lock (get stuck) or give way?' },
  { id: 'numbness-persists-off-bike', level: 'physio-soon', source: TRADE_PHYSIO, text: 'Do numbness or tingling in your hands, feet or legs carry on after you stop riding?' },
  { id: 'severe-pain', level: 'physio-soon', source: TRADE_PHYSIO, text: 'At its worst, is your pain 7 or more out of 10?' },
  { id: 'crash-or-fall', level: 'physio-routine', source: TRADE_PHYSIO, text: 'Did the pain start after a crash or fall?' },
  { id: 'not-settled-after-changes', level: 'physio-routine', source: TRADE_PHYSIO, text: 'Has the pain stayed the same or got worse even after changes to your bike position?' },
  { id: 'age-55-or-over', level: null, source: OTTAWA, text: 'Are you 55 or older?' },
  { id: 'kneecap-tender', level: null, source: OTTAWA, text: 'Since the crash, is the kneecap itself sore when you press on it?' },
  { id: 'fibular-head-tender', level: null, source: OTTAWA, text: 'Since the crash, is the bony bump on the outer side of the knee, just below the joint, sore when you press on it?' },
  { id: 'cannot-bend-knee-90', level: null, source: OTTAWA, text: 'Since the crash, are you unable to bend the knee to a right angle?' },
  { id: 'cannot-take-four-steps', level: null, source: OTTAWA, text: 'Straight after the crash and since, have you been unable to take four steps on that leg?' },
] as const satisfies readonly { id: string; level: ReferralLevel | null; source: string; text: string }[];

export type RedFlagId = (typeof RED_FLAG_QUESTIONS)[number]['id'];
export const RED_FLAG_IDS = RED_FLAG_QUESTIONS.map((q) => q.id) as [RedFlagId, ...RedFlagId[]];

/** Answers: question id → yes/no. An unanswered question counts as "no". */
export const redFlagAnswersSchema = z.partialRecord(z.enum(RED_FLAG_IDS), z.boolean());
export type RedFlagAnswers = z.infer<typeof redFlagAnswersSchema>;

export const redFlagScreenInputSchema = z.strictObject({
  answers: redFlagAnswersSchema.default({}),
  symptoms: z.array(symptomSchema).max(60).default([]),
  /** Age in years from the profile, if known. */
  age: z.number().int().min(5).max(120).optional(),
});
export type RedFlagScreenInput = z.input<typeof redFlagScreenInputSchema>;

export const redFlagTriggerSchema = z.object({
  id: z.string(),
  level: z.enum(REFERRAL_LEVELS),
  reason: z.string(),
  source: z.string(),
});
export type RedFlagTrigger = z.infer<typeof redFlagTriggerSchema>;

export const redFlagResultSchema = z.object({
  level: z.enum(REFERRAL_LEVELS),
  triggers: z.array(redFlagTriggerSchema),
  advice: z.string(),
});
export type RedFlagResult = z.infer<typeof redFlagResultSchema>;

/** What the rider is told at each level. */
export const REFERRAL_ADVICE: Record<ReferralLevel, string> = {
  none: 'No warning signs found. Your fitter will go through your answers with you.',
  'physio-routine': 'We suggest a physiotherapist looks at this. Your plan can wait until they have.',
  'physio-soon': 'Please see a physiotherapist soon, ideally within a few days, before changing your position further.',
  urgent: 'Stop riding and seek urgent medical care today (your doctor, an urgent care service or an emergency department).',
};

/** Numeric rank of a level, for comparisons. */
export function referralRank(level: ReferralLevel): number {
  return REFERRAL_LEVELS.indexOf(level);
}

/** The higher of two referral levels. */
export function maxReferral(a: ReferralLevel, b: ReferralLevel): ReferralLevel {
  return referralRank(a) >= referralRank(b) ? a : b;
}

/** Pain at or above this on the 0–10 scale is a physio referral (TRADE §6 [V]). */
export const SEVERE_PAIN = 7;

const OTTAWA_KNEE_SIGNS = ['kneecap-tender', 'fibular-head-tender', 'cannot-bend-knee-90', 'cannot-take-four-steps'] as const;

const questionText = (id: RedFlagId) => RED_FLAG_QUESTIONS.find((q) => q.id === id)?.text ?? id;

function fromSymptoms(symptoms: Symptom[]): Set<RedFlagId> {
  const found = new Set<RedFlagId>();
  for (const s of symptoms) {
    const offBike = s.timing.some((t) => t !== 'during-ride');
    if (s.timing.includes('at-rest') || s.timing.includes('at-night')) found.add('pain-at-rest-or-night');
    if (s.swelling) found.add('swelling-locking-giving-way');
    if (s.afterCrash) found.add('crash-or-fall');
    if (s.pain >= SEVERE_PAIN) found.add('severe-pain');
    const numb = s.numbness || s.kind === 'numb' || s.kind === 'tingling';
    if (numb && s.region === 'perineum') found.add(offBike ? 'saddle-numbness-persists' : 'saddle-numbness-riding');
    else if (numb && offBike) found.add('numbness-persists-off-bike');
    if (s.region === 'lower-back') found.add('back-pain');
  }
  return found;
}

/**
 * Decides the referral level from the screening answers, the body-map symptoms and the age,
 * and lists every finding that contributed (see the mapping at the top of this file).
 */
export function screenRedFlags(input: RedFlagScreenInput): RedFlagResult {
  const p = parseInput(redFlagScreenInputSchema, input, 'redFlags');
  const yes = fromSymptoms(p.symptoms);
  for (const [id, answer] of Object.entries(p.answers)) if (answer) yes.add(id as RedFlagId);
  if (p.age !== undefined && p.age >= 55) yes.add('age-55-or-over');

  const triggers: RedFlagTrigger[] = [];
  for (const q of RED_FLAG_QUESTIONS) {
    if (q.level && yes.has(q.id)) triggers.push({ id: q.id, level: q.level, reason: q.text, source: q.source });
  }
  if (yes.has('saddle-numbness-riding') && !yes.has('saddle-numbness-persists')) {
    const withSign = (['back-pain', 'leg-weakness', 'bladder-bowel-change'] as const).filter((id) => yes.has(id));
    if (withSign.length > 0) {
      triggers.push({
        id: 'saddle-numbness-with-signs',
        level: 'urgent',
        reason: `Numbness in the saddle area together with: ${withSign.map(questionText).join(' / ')}`,
        source: NICE,
      });
    }
  }
  const crash = yes.has('crash-or-fall');
  const kneeInvolved = p.symptoms.length === 0 || p.symptoms.some((s) => isKneeRegion(s.region));
  const ottawaSigns = OTTAWA_KNEE_SIGNS.filter((id) => yes.has(id)).length;
  const ottawaAge = kneeInvolved && yes.has('age-55-or-over');
  if (crash && (ottawaSigns > 0 || ottawaAge)) {
    triggers.push({
      id: 'crash-with-ottawa-sign',
      level: 'physio-soon',
      reason: 'After a crash or fall, a knee sign that the Ottawa knee rules use to decide on an X-ray.',
      source: OTTAWA,
    });
  }
  const physioLevel = triggers.filter((t) => t.level === 'physio-routine' || t.level === 'physio-soon');
  if (physioLevel.length >= 2 && physioLevel.every((t) => t.level === 'physio-routine')) {
    triggers.push({
      id: 'several-findings',
      level: 'physio-soon',
      reason: 'Several warning signs together.',
      source: 'our decision (no published rule): two or more physio-level findings are raised to "soon"',
    });
  }
  const level = triggers.reduce<ReferralLevel>((acc, t) => maxReferral(acc, t.level), 'none');
  return { level, triggers, advice: REFERRAL_ADVICE[level] };
}
