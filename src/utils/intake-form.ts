import { PAIN_KINDS, PAIN_TIMINGS, type BodyRegion } from '@shared/fit/triage';
import type { IntakeDraftInput, IntakeSubmitInput, IntakeView, RidingGoal, SymptomDraft } from '@shared/rider';

export type PainKind = (typeof PAIN_KINDS)[number];
export type PainTiming = (typeof PAIN_TIMINGS)[number];

/** One body-map entry as the form holds it: unanswered parts are null, never guessed. */
export interface SymptomEntry {
  region: BodyRegion;
  pain: number | null;
  kind: PainKind | null;
  timing: PainTiming[];
  durationDays: number | null;
  numbness: boolean;
  swelling: boolean;
  afterCrash: boolean;
}

export interface IntakeFormState {
  symptoms: SymptomEntry[];
  redFlagAnswers: Partial<Record<string, boolean>>;
  goals: RidingGoal[];
  goalNotes: string;
  bikeId: number | null;
  consent: boolean;
}

export const PAIN_KIND_LABELS: Record<PainKind, string> = { ache: 'Aching', sharp: 'Sharp', numb: 'Numb', tingling: 'Pins and needles', burning: 'Burning' };
export const PAIN_TIMING_LABELS: Record<PainTiming, string> = { 'during-ride': 'While riding', 'after-ride': 'After riding', 'at-rest': 'At rest', 'at-night': 'At night' };

export function emptySymptom(region: BodyRegion): SymptomEntry {
  return { region, pain: null, kind: null, timing: [], durationDays: null, numbness: false, swelling: false, afterCrash: false };
}

/** Start the form from a saved intake (a draft to resume, or a submitted one to update). */
export function formFromIntake(intake: IntakeView | null): IntakeFormState {
  return {
    symptoms: (intake?.symptoms ?? []).map((s: SymptomDraft) => ({
      region: s.region,
      pain: s.pain ?? null,
      kind: s.kind ?? null,
      timing: [...s.timing],
      durationDays: s.durationDays ?? null,
      numbness: s.numbness ?? false,
      swelling: s.swelling ?? false,
      afterCrash: s.afterCrash ?? false,
    })),
    redFlagAnswers: { ...(intake?.redFlagAnswers ?? {}) },
    goals: [...(intake?.goals ?? [])],
    goalNotes: intake?.goalNotes ?? '',
    bikeId: intake?.bikeId ?? null,
    // Consent is asked afresh on every submission, never carried over.
    consent: false,
  };
}

function withoutNulls(s: SymptomEntry) {
  return {
    region: s.region,
    timing: s.timing,
    numbness: s.numbness,
    swelling: s.swelling,
    afterCrash: s.afterCrash,
    ...(s.pain === null ? {} : { pain: s.pain }),
    ...(s.kind === null ? {} : { kind: s.kind }),
    ...(s.durationDays === null ? {} : { durationDays: s.durationDays }),
  };
}

export function draftInput(form: IntakeFormState): IntakeDraftInput {
  return {
    symptoms: form.symptoms.map(withoutNulls),
    redFlagAnswers: form.redFlagAnswers as IntakeDraftInput['redFlagAnswers'],
    goals: form.goals,
    goalNotes: form.goalNotes,
    bikeId: form.bikeId,
  };
}

/** What is sent on submission; the server computes the triage from it, so none is sent. */
export function submitInput(form: IntakeFormState, consentVersion: string): IntakeSubmitInput {
  return {
    ...draftInput(form),
    symptoms: form.symptoms.map(withoutNulls) as IntakeSubmitInput['symptoms'],
    goals: form.goals,
    consent: { kind: 'store-health-data', version: consentVersion, agreed: form.consent as true },
  };
}
