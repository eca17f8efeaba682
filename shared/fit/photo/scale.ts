/** Millimetres per pixel from a known length in the picture. */
import { ensureFinite, parseInput, requireRange } from '../errors';
import { requireApart } from './geometry';
import { parseTyreSize } from './iso5775';
import { scaleReferenceSchema, type ScaleReference, type ValueWithUncertainty } from './schemas';

export interface PhotoScale {
  mmPerPixel: ValueWithUncertainty;
  /** The real length used, mm. */
  knownLengthMm: number;
  /** How the number was reached. */
  how: string;
}

/**
 * Millimetres per pixel from a marked known length: a wheel diameter (ISO 5775 bead-seat, or
 * tyre outside ≈ BSD + 2 × width, TRADE §7), a crank (BB centre to spindle), or any known length.
 *
 * Uncertainty, first-order worst case: each end may be off by ±`clickPrecisionPx`, so the pixel
 * length is off by up to 2N; relative error = 2N / pixels + tolerance / length.
 * The outside-diameter tolerance is half of the 0–10 % section-height range (SECTION_HEIGHT_FACTOR_RANGE).
 */
export function photoScale(reference: ScaleReference, clickPrecisionPx = 2): PhotoScale {
  const ref = parseInput(scaleReferenceSchema, reference, 'scale');
  // The same bound as photoMeasurementInputSchema; a negative precision would give a negative ±.
  requireRange('clickPrecisionPx', clickPrecisionPx, 0, 50, 'px');
  const px = requireApart(['scale start', 'scale end'], ref.from, ref.to);
  let length: number;
  let tolerance = 0;
  let how: string;
  if (ref.kind === 'wheel') {
    const tyre = parseTyreSize(ref.tyre);
    if (ref.diameter === 'bead-seat') {
      length = tyre.bsd;
      how = `Rim bead-seat diameter ${tyre.bsd} mm (ISO 5775, ${tyre.wheel.commonName}).`;
    } else {
      const [lo, hi] = tyre.outsideDiameterRange;
      length = (lo + hi) / 2;
      tolerance = (hi - lo) / 2;
      how = `Tyre outside diameter ≈ ${tyre.bsd} + 2 × ${tyre.widthMm} mm, allowing the tyre to stand up to 10 % taller than its width: ${lo.toFixed(0)}–${hi.toFixed(0)} mm.`;
    }
  } else if (ref.kind === 'crank') {
    length = ref.crankLength;
    how = `Crank length ${ref.crankLength} mm, bottom-bracket centre to pedal-spindle centre.`;
  } else {
    length = ref.lengthMm;
    tolerance = ref.toleranceMm;
    how = `Known length ${ref.lengthMm} mm.`;
  }
  const value = length / px;
  const relative = (2 * clickPrecisionPx) / px + tolerance / length;
  return {
    mmPerPixel: { value: ensureFinite('mmPerPixel', value), plusMinus: ensureFinite('mmPerPixel', value * relative) },
    knownLengthMm: length,
    how: `${how} ${px.toFixed(1)} px between the marks.`,
  };
}
