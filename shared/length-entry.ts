/**
 * Lengths in forms. The stored millimetre value is the truth; the number in the box is only how
 * it looks in the rider's unit. A box the rider did not change must give back the stored value
 * exactly: rounding 720 mm to 28.35 in and back gives 720.1 mm, and the planner reads any move
 * over 0.05 mm as a change to the bike.
 */
import { fromMm, toMm, type LengthUnit } from './units';

/** Decimals a form shows: tenths of a millimetre (the storage step), hundredths of an inch (≈ 0.25 mm). */
export const LENGTH_DECIMALS: Record<LengthUnit, number> = { mm: 1, in: 2 };

function roundTo(value: number, decimals: number): number {
  const f = 10 ** decimals;
  // toFixed first, so binary artefacts (29.25 in = 742.9499… mm in floating point) round as on paper.
  return Math.round(Number((value * f).toFixed(6))) / f;
}

/** Storage precision: a tenth of a millimetre is far below what a tape measure resolves. */
export function roundMm(mm: number): number {
  return roundTo(mm, LENGTH_DECIMALS.mm);
}

/** A stored length as the number a form shows in `unit`. */
export function lengthForDisplay(mm: number, unit: LengthUnit): number {
  return roundTo(fromMm(mm, unit), LENGTH_DECIMALS[unit]);
}

/** True when two lengths look the same in `unit`, so a rider could not have told them apart. */
export function sameWhenShown(aMm: number, bMm: number, unit: LengthUnit): boolean {
  return lengthForDisplay(aMm, unit) === lengthForDisplay(bMm, unit);
}

/**
 * What a number typed in `unit` means in millimetres. When it is the number the box already
 * showed for `currentMm`, the rider has not changed it, so the stored value stands unrounded.
 */
export function typedToMm(typed: number | null, unit: LengthUnit, currentMm: number | null): number | null {
  if (typed === null || !Number.isFinite(typed)) return null;
  if (currentMm !== null && typed === lengthForDisplay(currentMm, unit)) return currentMm;
  return roundMm(toMm(typed, unit));
}

/**
 * A stored length as the number to send in `unit`: unrounded, so the server's conversion back
 * (× 25.4, then `roundMm`) lands on the same tenth of a millimetre.
 */
export function lengthForSending(mm: number, unit: LengthUnit): number {
  return fromMm(mm, unit);
}

/** Keep the current value when the new one looks the same in the unit it was typed in. */
export function keepIfSameWhenShown(newMm: number, currentMm: number | null | undefined, unit: LengthUnit): number {
  return currentMm !== null && currentMm !== undefined && sameWhenShown(newMm, currentMm, unit) ? currentMm : newMm;
}
