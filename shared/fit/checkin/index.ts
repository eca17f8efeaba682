/** Check-in analysis: trends per region and the next action. */
export { analyseCheckIn, LOW_COMFORT } from './analyse';
export { compareScores, MEANINGFUL_CHANGE } from './compare';
export {
  CHANGE_CATEGORIES,
  changeSchema,
  CHECK_IN_DECISIONS,
  checkInAnalysisInputSchema,
  checkInAnalysisSchema,
  checkInRegionSchema,
  checkInSchema,
  type Change,
  type ChangeCategory,
  type CheckIn,
  type CheckInAnalysis,
  type CheckInAnalysisInput,
  type CheckInDecision,
  type CheckInInput,
  type CheckInRegion,
} from './schemas';
