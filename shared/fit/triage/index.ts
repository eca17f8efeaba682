/** Triage: body regions, possible fit causes, red-flag screening and cautions. */
export { CAUTION_LOCAL_LAW, CAUTION_NOT_A_DIAGNOSIS, CAUTION_SEE_A_CLINICIAN, CAUTION_URGENT, CAUTIONS } from './cautions';
export { CAUSE_TABLE, causeRowFor, FIT_CAUSES, rankedCauseSchema, rankFitCauses, type CauseRowId, type FitCause, type RankedCause } from './causes';
export {
  maxReferral,
  RED_FLAG_IDS,
  RED_FLAG_QUESTIONS,
  redFlagAnswersSchema,
  redFlagResultSchema,
  redFlagScreenInputSchema,
  redFlagTriggerSchema,
  REFERRAL_ADVICE,
  referralRank,
  screenRedFlags,
  SEVERE_PAIN,
  type RedFlagAnswers,
  type RedFlagId,
  type RedFlagResult,
  type RedFlagScreenInput,
  type RedFlagTrigger,
} from './red-flags';
export { BODY_REGIONS, isKneeRegion, REGION_INFO, type BodyRegion, type RegionInfo } from './regions';
export {
  bodyRegionSchema,
  PAIN_KINDS,
  PAIN_TIMINGS,
  painScoreSchema,
  REFERRAL_LEVELS,
  symptomSchema,
  type ReferralLevel,
  type Symptom,
  type SymptomInput,
} from './schemas';
