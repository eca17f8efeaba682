import { fromMm, toMm, type LengthUnit } from '@shared/units';

/** Decimals shown per unit: tenths of a millimetre, hundredths of an inch (≈ 0.25 mm). */
export const DECIMALS: Record<LengthUnit | 'deg', number> = { mm: 1, in: 2, deg: 1 };

function round(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}

/** A stored millimetre value as the rider sees it in their unit. */
export function mmForDisplay(mm: number, unit: LengthUnit): number {
  return round(fromMm(mm, unit), DECIMALS[unit]);
}

/** A typed length carried over when the rider switches unit mid-form. */
export function convertTyped(value: number | null, from: LengthUnit, to: LengthUnit): number | null {
  if (value === null || from === to) return value;
  return round(fromMm(toMm(value, from), to), DECIMALS[to]);
}

/** "742 mm", "29.21 in", "-1.5°": a value with its unit, for read-only displays. */
export function formatMeasure(value: number, unit: 'mm' | 'deg', display: LengthUnit): string {
  if (unit === 'deg') return `${round(value, 1)}°`;
  return `${mmForDisplay(value, display)} ${display}`;
}
