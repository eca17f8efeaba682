/** Saddle-height estimates, the knee-angle leg model and corrections. See shared/README.md. */
export {
  CLEAT_SMALL_MOVE_MM,
  COMMON_CRANK_LENGTHS_MM,
  CRANK_SIZE_STEP_MM,
  DEFAULT_CRANK_LENGTH_MM,
  DEFAULT_SEAT_TUBE_ANGLE_DEG,
  DISAGREEMENT_FRACTION_OF_INSEAM,
  DYNAMIC_KNEE_FLEXION_DEG,
  FERRER_ROCA_FACTORS,
  GATTI_2021,
  HAMLEY_THOMAS_FACTOR,
  INSEAM_MINUS_MM,
  LEMOND_CLIPLESS_REDUCTION_MM,
  LEMOND_FACTOR,
  REFERENCE_STACK_MM,
  STATIC_KNEE_FLEXION_DEG,
  STATIC_KNEE_FLEXION_WIDE_DEG,
} from './constants';
export {
  cleatMoveCorrection,
  crankChangeCorrection,
  railSlideToKeepSetback,
  seatPostMove,
  seatPostMoveForVertical,
  stackChangeCorrection,
  type SeatPostMove,
} from './corrections';
export { estimateSaddleHeight, gattiSaddleHeightCm, spindleToBottomBracket } from './estimates';
export { kneeFlexionAt, legModelSchema, saddleHeightForKneeFlexion, type LegModel, type LegPose, type Point2 } from './leg-model';
export {
  EVIDENCE_TAGS,
  SADDLE_HEIGHT_CONVENTIONS,
  SADDLE_HEIGHT_METHODS,
  saddleHeightEstimateSchema,
  saddleHeightInputSchema,
  saddleHeightSummarySchema,
  type EvidenceTag,
  type SaddleHeightConvention,
  type SaddleHeightEstimate,
  type SaddleHeightInput,
  type SaddleHeightMethod,
  type SaddleHeightSummary,
} from './schemas';
