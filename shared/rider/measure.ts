/**
 * Lengths typed in the rider's unit (mm or inches) and stored in millimetres. Validation runs on
 * the converted value, so the plausibility limits are the same whatever unit was typed, and the
 * messages quote the limits in the unit the rider used.
 */
import { z } from 'zod';
import { LENGTH_UNITS, formatLength, inchesToMm, type LengthUnit } from '../units';
import { keepIfSameWhenShown, roundMm } from '../length-entry';
import { PARAMETER_INFO, SETUP_PARAMETERS, type Setup, type SetupParameter } from '../fit/setup';

export { roundMm };

export const lengthUnitSchema = z.enum(LENGTH_UNITS, { error: 'Choose mm or in as the unit.' });

export interface MeasureInfo {
  label: string;
  unit: 'mm' | 'deg';
  min: number;
  max: number;
  /** How to measure it, in words a rider can follow. */
  measure: string;
  /** The same guide for a rider viewing inches, when `measure` quotes a metric figure. */
  measureInches?: string;
}

function limit(value: number, info: MeasureInfo, unit: LengthUnit): string {
  return info.unit === 'deg' ? `${value}°` : formatLength(value, unit);
}

/** One measurement typed in `unit`, parsed to millimetres (degrees pass through unchanged). */
export function measureSchema(info: MeasureInfo, unit: LengthUnit) {
  const toStored = info.unit === 'mm' && unit === 'in' ? (v: number) => roundMm(inchesToMm(v)) : (v: number) => roundMm(v);
  return z
    .number({ error: `Enter the ${info.label} as a number.` })
    .transform(toStored)
    .pipe(
      z
        .number()
        .min(info.min, `The ${info.label} must be at least ${limit(info.min, info, unit)}.`)
        .max(info.max, `The ${info.label} must be at most ${limit(info.max, info, unit)}.`),
    );
}

/** A full setup typed in `unit`; output is a `Setup` in millimetres and degrees. */
export function setupInUnitSchema(unit: LengthUnit) {
  const shape = {} as Record<SetupParameter, ReturnType<typeof measureSchema>>;
  for (const p of SETUP_PARAMETERS) shape[p] = measureSchema(PARAMETER_INFO[p], unit);
  return z.strictObject(shape, {
    error: (issue) => {
      if (issue.code === 'unrecognized_keys') return `Unexpected setup field: ${issue.keys.join(', ')}.`;
      if (issue.code === 'invalid_type') return 'Enter the bike setup: saddle height, setback, tilt, reach, drop and the rest.';
      return undefined;
    },
  });
}

/**
 * A re-measured setup with every length that looks the same in `unit` as today's value kept at
 * today's value. Inches show to 0.01 in (≈ 0.25 mm), so a form that sent back the rounded figure
 * would otherwise store a move of up to 0.13 mm the rider never made, and the planner counts any
 * move over 0.05 mm as a change to the bike.
 */
export function keepShownLengths(measured: Setup, current: Setup | null, unit: LengthUnit): Setup {
  if (!current) return measured;
  const out = { ...measured };
  for (const p of SETUP_PARAMETERS) {
    if (PARAMETER_INFO[p].unit === 'mm') out[p] = keepIfSameWhenShown(measured[p], current[p], unit);
  }
  return out;
}
