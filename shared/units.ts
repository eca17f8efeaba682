/**
 * Display units. Everything inside Saddlestep is millimetres and degrees; inches exist only
 * on screen, converted at the edge with these helpers.
 */
import { FitInputError, requireFinite } from './fit/errors';

/** Millimetres in one inch: exactly 25.4 by the 1959 international yard and pound agreement. */
export const MM_PER_INCH = 25.4;

export const LENGTH_UNITS = ['mm', 'in'] as const;
export type LengthUnit = (typeof LENGTH_UNITS)[number];

/** Millimetres to inches. */
export function mmToInches(mm: number): number {
  return requireFinite('mm', mm) / MM_PER_INCH;
}

/** Inches to millimetres. */
export function inchesToMm(inches: number): number {
  return requireFinite('inches', inches) * MM_PER_INCH;
}

/** Converts a length in millimetres to the display unit. */
export function fromMm(mm: number, unit: LengthUnit): number {
  return unit === 'mm' ? requireFinite('mm', mm) : mmToInches(mm);
}

/** Converts a length typed in the display unit back to millimetres for storage. */
export function toMm(value: number, unit: LengthUnit): number {
  return unit === 'mm' ? requireFinite('value', value) : inchesToMm(value);
}

/**
 * Formats a length for display: whole millimetres with one decimal when it is not whole
 * (half sizes such as 172.5 mm cranks matter), or inches to two decimals.
 */
export function formatLength(mm: number, unit: LengthUnit = 'mm', decimals?: number): string {
  const value = fromMm(mm, unit);
  if (unit === 'in') return `${value.toFixed(decimals ?? 2)} in`;
  const d = decimals ?? (Number.isInteger(Math.round(value * 10) / 10) ? 0 : 1);
  return `${value.toFixed(d)} mm`;
}

/** Formats an angle in degrees, one decimal. */
export function formatAngle(deg: number, decimals = 1): string {
  return `${requireFinite('deg', deg).toFixed(decimals)}°`;
}

/** Signed change for instructions: "+4 mm", "−2.5 mm", "+0.12 in". */
export function formatSignedLength(mm: number, unit: LengthUnit = 'mm'): string {
  if (!Number.isFinite(mm)) throw new FitInputError('mm', 'mm must be a finite number.');
  const sign = mm > 0 ? '+' : mm < 0 ? '−' : '±';
  return `${sign}${formatLength(Math.abs(mm), unit)}`;
}
