import type { z } from 'zod';

/**
 * Raised for input the fit computation cannot use: a negative or absurd length, NaN, points
 * that coincide, an unknown tyre size. `field` names the offending input (a dotted path such
 * as `points.knee` or `inseam`) so the UI can put the message beside it.
 */
export class FitInputError extends Error {
  override readonly name = 'FitInputError';
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.field = field;
  }
}

/** Returns `value` when it is a finite number, otherwise throws a FitInputError for `field`. */
export function requireFinite(field: string, value: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new FitInputError(field, `${field} must be a finite number (got ${String(value)}).`);
  }
  return value;
}

/**
 * Returns `value` when it is finite and within [min, max]; the bounds are "absurd value" guards,
 * not advice, so a value outside them is almost certainly a typing or unit mistake.
 */
export function requireRange(field: string, value: number, min: number, max: number, unit = ''): number {
  requireFinite(field, value);
  if (value < min || value > max) {
    const u = unit ? ` ${unit}` : '';
    throw new FitInputError(field, `${field} must be between ${min} and ${max}${u} (got ${value}${u}).`);
  }
  return value;
}

/**
 * Parses `value` with a zod schema and turns the first issue into a FitInputError, so every
 * public function reports bad input the same way whether it came from a form or from code.
 */
export function parseInput<S extends z.ZodType>(schema: S, value: unknown, root = 'input'): z.output<S> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const issue = result.error.issues[0];
  const path = issue && issue.path.length > 0 ? issue.path.map(String).join('.') : root;
  throw new FitInputError(path, `${path}: ${issue?.message ?? 'invalid value'}`);
}

/**
 * Last line of defence against NaN leaking out of a computation: every public numeric result
 * passes through here. An internal fault surfaces as an error, never as NaN on a screen.
 */
export function ensureFinite(field: string, value: number): number {
  if (!Number.isFinite(value)) {
    throw new FitInputError(field, `${field} could not be computed from these inputs.`);
  }
  return value;
}
