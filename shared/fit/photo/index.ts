/**
 * Photo geometry: angles, scale, knee-to-spindle offset, uncertainty, static-vs-dynamic notes.
 * Point checks (distance, requireApart) stay inside the area.
 */
export { includedAngle, type AngleWithSensitivity } from './geometry';
export { ISO_5775_WHEEL_SIZES, parseTyreSize, SECTION_HEIGHT_FACTOR_RANGE, type TyreSize, type WheelSize } from './iso5775';
export { CRANK_LEVEL_TOLERANCE_DEG, isCrankLevelWarning, KOPS_NOTE, measurePhoto } from './measure';
export { photoScale, type PhotoScale } from './scale';
export {
  photoMeasurementInputSchema,
  photoMeasurementSchema,
  photoPointsSchema,
  pixelPointSchema,
  scaleReferenceSchema,
  type PhotoMeasurement,
  type PhotoMeasurementInput,
  type PhotoPoints,
  type PixelPoint,
  type ScaleReference,
  type ValueWithUncertainty,
} from './schemas';
export {
  dynamicToStaticKneeFlexion,
  STATIC_DYNAMIC_NOTE,
  STATIC_TO_DYNAMIC_KNEE_DEG,
  staticToDynamicKneeFlexion,
  VIDEO_2D_UNDERESTIMATE_DEG,
  video2dTo3dKneeAngle,
  type AngleEstimate,
} from './static-dynamic';
