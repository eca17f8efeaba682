import { z } from 'zod';
import { PARAMETER_INFO, SETUP_PARAMETERS, type SetupParameter } from './parameters';

function parameterSchema(p: SetupParameter) {
  const info = PARAMETER_INFO[p];
  return z
    .number({ error: `Enter the ${info.label} as a number.` })
    .min(info.min, `The ${info.label} must be at least ${info.min} ${info.unit}.`)
    .max(info.max, `The ${info.label} must be at most ${info.max} ${info.unit}.`);
}

/** One bike setup: every parameter, in millimetres or degrees (see PARAMETER_INFO). */
export const setupSchema = z.strictObject({
  saddleHeight: parameterSchema('saddleHeight'),
  saddleSetback: parameterSchema('saddleSetback'),
  saddleTilt: parameterSchema('saddleTilt'),
  reach: parameterSchema('reach'),
  drop: parameterSchema('drop'),
  stemLength: parameterSchema('stemLength'),
  spacerStack: parameterSchema('spacerStack'),
  crankLength: parameterSchema('crankLength'),
  stack: parameterSchema('stack'),
  cleatForeAft: parameterSchema('cleatForeAft'),
  cleatRotation: parameterSchema('cleatRotation'),
});
export type Setup = z.infer<typeof setupSchema>;

export const setupParameterSchema = z.enum(SETUP_PARAMETERS);

/** An ISO calendar date (YYYY-MM-DD) that exists. Plans count whole days in UTC. */
export const isoDateSchema = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2025-03-01.')
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
  }, 'That date does not exist.');
export type IsoDate = z.infer<typeof isoDateSchema>;
