/** Whole-day date arithmetic on ISO dates, in UTC so that time zones never shift a plan. */
import { FitInputError, requireRange } from '../errors';

const DAY_MS = 86_400_000;

/** Throws FitInputError unless `date` is a real calendar date written YYYY-MM-DD. */
function requireIsoDate(field: string, date: string): number {
  const ms = typeof date === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(date) ? Date.parse(`${date}T00:00:00Z`) : Number.NaN;
  if (!Number.isFinite(ms) || new Date(ms).toISOString().slice(0, 10) !== date) {
    throw new FitInputError(field, `${field} must be a real date written like 2025-03-01 (got ${String(date)}).`);
  }
  return ms;
}

/**
 * The ISO date `days` after `date`. Days are whole and within ±100,000 (about 270 years), a guard
 * that keeps the result a four-digit-year date.
 */
export function addDays(date: string, days: number): string {
  const ms = requireIsoDate('date', date);
  if (!Number.isInteger(requireRange('days', days, -100_000, 100_000))) throw new FitInputError('days', `days must be a whole number (got ${days}).`);
  return new Date(ms + days * DAY_MS).toISOString().slice(0, 10);
}

/** Whole days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round((requireIsoDate('to', to) - requireIsoDate('from', from)) / DAY_MS);
}
