/** Everything the photo workspace derives from marked points, each with its ± from click precision. */
import { ensureFinite, FitInputError, parseInput } from '../errors';
import { includedAngle, requireApart } from './geometry';
import { photoScale } from './scale';
import {
  photoMeasurementInputSchema,
  type PhotoMeasurement,
  type PhotoMeasurementInput,
  type PixelPoint,
  type ValueWithUncertainty,
} from './schemas';
import { STATIC_DYNAMIC_NOTE } from './static-dynamic';

/**
 * Knee over pedal spindle is a starting point, not a target: widely criticised as having no
 * biomechanical basis (Holliday & Swart 2021, Sports Med Health Sci 3(2):93–100 [V]); endurance
 * riders often sit about 1 cm behind (common practice [CP]).
 */
export const KOPS_NOTE =
  'Knee over pedal spindle is a starting point, not a target (Holliday & Swart 2021). ' +
  'Endurance riders often sit about 1 cm behind the spindle (common practice).';

/**
 * The offset assumes level cranks. With the bottom bracket marked, a crank more than this far from
 * horizontal (degrees) earns a warning: our decision, about where a photo taken "level" by eye lands.
 */
export const CRANK_LEVEL_TOLERANCE_DEG = 5;

const CRANK_WARNING_START = 'The crank is ';

/** Whether a note of `measurePhoto` is the crank-level warning (the screen shows it as a warning). */
export function isCrankLevelWarning(note: string): boolean {
  return note.startsWith(CRANK_WARNING_START);
}

/** A warning when the crank (bottom bracket → spindle) is off level by more than the tolerance, or null. */
function crankLevelWarning(bottomBracket: PixelPoint, spindle: PixelPoint): string | null {
  requireApart(['bottomBracket', 'spindle'], bottomBracket, spindle);
  const dx = Math.abs(spindle.x - bottomBracket.x);
  const dy = Math.abs(spindle.y - bottomBracket.y);
  const offLevel = (Math.atan2(dy, dx) * 180) / Math.PI;
  if (offLevel <= CRANK_LEVEL_TOLERANCE_DEG) return null;
  return `${CRANK_WARNING_START}${offLevel.toFixed(0)}° from level, more than ${CRANK_LEVEL_TOLERANCE_DEG}°: the knee-to-spindle offset assumes level cranks, so re-take the photo with the cranks at 3 and 9 o'clock.`;
}

const round = (v: ValueWithUncertainty): ValueWithUncertainty => ({
  value: ensureFinite('value', v.value),
  plusMinus: ensureFinite('plusMinus', v.plusMinus),
});

function angle(a: PixelPoint, b: PixelPoint, c: PixelPoint, names: [string, string, string], n: number) {
  const r = includedAngle(a, b, c, names);
  return { value: r.degrees, plusMinus: r.degreesPerPixel * n };
}

/**
 * Measures a side-view photo.
 * - kneeFlexion = 180° − angle(hip, knee, ankle) (0° = straight leg);
 * - hipAngle = included angle shoulder–hip–knee; ankleAngle = included angle knee–ankle–toe;
 * - kneeToSpindleMm = horizontal offset from the spindle to the front of the knee, cranks level,
 *   positive when the knee is ahead of the spindle (toward the front wheel); needs a scale;
 * - thighMm, shankMm: hip–knee and knee–ankle lengths (for the leg model); need a scale.
 * Each result is null when its points are not marked. Uncertainty is the first-order worst case
 * for a click precision of ±N px on every point (see shared/README.md). The photo must be taken
 * level and square to the bike; no lens or perspective correction is made.
 */
export function measurePhoto(input: PhotoMeasurementInput): PhotoMeasurement {
  const p = parseInput(photoMeasurementInputSchema, input, 'photo');
  const { hip, knee, ankle, kneeFront, spindle, shoulder, toe, bottomBracket } = p.points;
  const n = p.clickPrecisionPx;
  const notes: string[] = [];
  const scale = p.scale ? photoScale(p.scale, n) : null;
  const s = scale?.mmPerPixel ?? null;
  if (scale) notes.push(scale.how);

  let kneeFlexion: ValueWithUncertainty | null = null;
  if (hip && knee && ankle) {
    const a = angle(hip, knee, ankle, ['hip', 'knee', 'ankle'], n);
    kneeFlexion = round({ value: 180 - a.value, plusMinus: a.plusMinus });
    notes.push(STATIC_DYNAMIC_NOTE);
  }
  const hipAngle = shoulder && hip && knee ? round(angle(shoulder, hip, knee, ['shoulder', 'hip', 'knee'], n)) : null;
  const ankleAngle = knee && ankle && toe ? round(angle(knee, ankle, toe, ['knee', 'ankle', 'toe'], n)) : null;

  const length = (a: PixelPoint, b: PixelPoint, names: [string, string]): ValueWithUncertainty | null => {
    const px = requireApart(names, a, b);
    if (!s) return null;
    return round({ value: px * s.value, plusMinus: 2 * n * s.value + px * s.plusMinus });
  };
  const thighMm = hip && knee ? length(hip, knee, ['hip', 'knee']) : null;
  const shankMm = knee && ankle ? length(knee, ankle, ['knee', 'ankle']) : null;

  let kneeToSpindleMm: ValueWithUncertainty | null = null;
  if (kneeFront && spindle && s) {
    const dxPx = (kneeFront.x - spindle.x) * (p.facing === 'right' ? 1 : -1);
    kneeToSpindleMm = round({ value: dxPx * s.value, plusMinus: 2 * n * s.value + Math.abs(dxPx) * s.plusMinus });
    notes.push(
      'Offset taken with the cranks level; positive means the front of the knee is ahead of the pedal spindle.',
    );
  }
  if (kneeFront && spindle && !s) notes.push('Mark a known length to turn the knee-to-spindle offset into millimetres.');
  // The offset (scaled or not yet) is only meaningful with level cranks, so warn as soon as it is marked.
  const crankWarning = kneeFront && spindle && bottomBracket ? crankLevelWarning(bottomBracket, spindle) : null;
  if (crankWarning) notes.push(crankWarning);

  if (!kneeFlexion && !hipAngle && !ankleAngle && !thighMm && !shankMm && !kneeToSpindleMm && !scale) {
    throw new FitInputError('points', 'Mark at least hip, knee and ankle, or the knee front and the pedal spindle.');
  }
  return { mmPerPixel: s ? round(s) : null, kneeFlexion, hipAngle, ankleAngle, kneeToSpindleMm, thighMm, shankMm, notes };
}
