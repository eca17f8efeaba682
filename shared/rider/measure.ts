/**
 * Lengths typed in the rider's unit (mm or inches) and stored in millimetres. Validation runs on
 * the converted value, so the plausibility limits are the same whatever unit was typed, and the
 * messages quote the limits in the unit the rider used.
 */
import { z } from 'zod';
import { LENGTH_UNITS, formatLength, inchesToMm, type LengthUnit } from '../units';
import { PARAMETER_INFO, SETUP_PARAMETERS, type SetupParameter } from '../fit/setup';

export const lengthUnitSchema = z.enum(LENGTH_UNITS, { error: 'Choose mm or in as the unit.' });

export interface MeasureInfo {
  label: string;
  unit: 'mm' | 'deg';
  min: number;
  max: number;
  /** How to measure it, in words a rider can follow. */
  measure: string;
}

/** Storage precision: a tenth of a millimetre is far below what a tape measure resolves. */
export function roundMm(mm: number): number {
  // toFixed first, so binary artefacts (29.25 in = 742.9499… mm in floating point) round as on paper.
  return Math.round(Number((mm * 10).toFixed(6))) / 10;
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
