/** ISO 5775 (ETRTO) wheel sizes for the photo-scale picker. */
import { FitInputError } from '../errors';

export interface WheelSize {
  /** Bead-seat diameter, mm: the number after the dash in an ISO 5775 size such as 25-622. */
  bsd: number;
  /** Names riders know it by. */
  commonName: string;
  /** Where the name comes from: TRADE.md §7 [V] or [from memory]. */
  nameSource: string;
}

/**
 * Bead-seat diameters, mm, from ISO 5775 (ETRTO) [V] (TRADE §7). Common names marked [V] are
 * in TRADE §7; the others are [from memory].
 */
export const ISO_5775_WHEEL_SIZES: readonly WheelSize[] = [
  { bsd: 635, commonName: '28 × 1½" (roadster)', nameSource: '[from memory]' },
  { bsd: 630, commonName: '27"', nameSource: '[from memory]' },
  { bsd: 622, commonName: '700C / 29"', nameSource: 'ISO 5775 [V]' },
  { bsd: 590, commonName: '650A / 26 × 1⅜"', nameSource: '[from memory]' },
  { bsd: 584, commonName: '650B / 27.5"', nameSource: 'ISO 5775 [V]' },
  { bsd: 571, commonName: '650C', nameSource: '[from memory]' },
  { bsd: 559, commonName: '26" MTB', nameSource: 'ISO 5775 [V]' },
  { bsd: 507, commonName: '24"', nameSource: 'ISO 5775 [V]' },
  { bsd: 451, commonName: '20" (451)', nameSource: 'ISO 5775 [V]' },
  { bsd: 406, commonName: '20" (406)', nameSource: 'ISO 5775 [V]' },
  { bsd: 305, commonName: '16"', nameSource: 'ISO 5775 [V]' },
];

/**
 * Section height ≈ tyre width (TRADE §7 [V2]). The upper factor 1.1 has no source: it was fitted
 * so that a 25-622 tyre gives the top of TRADE's check range, 677 mm (622 + 2 × 27.5) [D, fitted].
 * The test of that check value is therefore a consistency check with TRADE's table, not an
 * independent verification; only the lower end (factor 1, 672 mm) follows from the quoted rule.
 */
export const SECTION_HEIGHT_FACTOR_RANGE = [1, 1.1] as const;

export interface TyreSize {
  widthMm: number;
  bsd: number;
  wheel: WheelSize;
  /** BSD + 2 × width, mm (TRADE §7 [V2]). */
  outsideDiameter: number;
  /** Outside diameter range, mm, from SECTION_HEIGHT_FACTOR_RANGE. */
  outsideDiameterRange: [number, number];
}

/**
 * Tyre widths we accept, mm: narrow track tyres to fat-bike tyres. A plausibility guard and our
 * decision, no source (the end sizes are [from memory]); a width outside is taken as a typing mistake.
 */
const WIDTH_LIMITS = [16, 130] as const;

/**
 * Parses an ISO 5775 tyre size such as `25-622` (width-BSD, mm). Throws FitInputError for a
 * malformed string, an implausible width or a bead-seat diameter not in ISO_5775_WHEEL_SIZES.
 */
export function parseTyreSize(size: string): TyreSize {
  const match = /^\s*(\d{2,3})\s*-\s*(\d{3})\s*$/.exec(String(size));
  if (!match) {
    throw new FitInputError('tyre', `"${size}" is not an ISO 5775 tyre size; use width-diameter, like 25-622.`);
  }
  const widthMm = Number(match[1]);
  const bsd = Number(match[2]);
  const wheel = ISO_5775_WHEEL_SIZES.find((w) => w.bsd === bsd);
  if (!wheel) {
    throw new FitInputError('tyre', `${bsd} mm is not a bead-seat diameter we know; pick a wheel size from the list.`);
  }
  if (widthMm < WIDTH_LIMITS[0] || widthMm > WIDTH_LIMITS[1]) {
    throw new FitInputError('tyre', `A ${widthMm} mm wide tyre is outside ${WIDTH_LIMITS[0]}–${WIDTH_LIMITS[1]} mm; check the size.`);
  }
  const [lo, hi] = SECTION_HEIGHT_FACTOR_RANGE;
  return {
    widthMm,
    bsd,
    wheel,
    outsideDiameter: bsd + 2 * widthMm,
    outsideDiameterRange: [bsd + 2 * widthMm * lo, bsd + 2 * widthMm * hi],
  };
}
