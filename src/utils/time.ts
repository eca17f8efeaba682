/*
 * Dates and times in a named IANA zone, with Intl only (no date library in the rider's bundle).
 * A "date key" is a calendar date written YYYY-MM-DD; instants are ISO strings in UTC.
 */

/** The zone if this browser knows it, else undefined (the browser's own zone). */
function knownZone(zone: string | undefined): string | undefined {
  if (!zone) return undefined;
  try {
    new Intl.DateTimeFormat('en', { timeZone: zone });
    return zone;
  } catch {
    return undefined;
  }
}

function format(date: Date, zone: string | undefined, options: Intl.DateTimeFormatOptions, locale?: string): string {
  return new Intl.DateTimeFormat(locale, { ...options, timeZone: knownZone(zone) }).format(date);
}

/** The calendar date of an instant in `zone`, e.g. "2027-03-09". */
export function dateKeyIn(instant: Date | string, zone: string | undefined): string {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone: knownZone(zone), year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(
    new Date(instant),
  );
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('year')}-${part('month')}-${part('day')}`;
}

/** `days` calendar days after (or before) a date key. */
export function addDays(dateKey: string, days: number): string {
  const date = new Date(`${dateKey}T12:00:00Z`);
  date.setUTCDate(date.getUTCDate() + days);
  return date.toISOString().slice(0, 10);
}

/** ISO weekday of a date key: 1 = Monday … 7 = Sunday. */
export function weekdayOf(dateKey: string): number {
  const day = new Date(`${dateKey}T12:00:00Z`).getUTCDay();
  return day === 0 ? 7 : day;
}

/** "Tue 9 Mar": a calendar date as a day heading (the date is already local, so no zone shift). */
export function formatDayHeading(dateKey: string): string {
  return format(new Date(`${dateKey}T12:00:00Z`), 'UTC', { weekday: 'short', day: 'numeric', month: 'short' });
}

/** "09:30" (or "9:30 AM", as the viewer's locale writes times) in `zone`. */
export function formatTime(instant: string, zone: string | undefined): string {
  return format(new Date(instant), zone, { hour: 'numeric', minute: '2-digit' });
}

/** "Tuesday 9 March 2027 at 09:00" in `zone`. */
export function formatDateTime(instant: string, zone: string | undefined): string {
  return format(new Date(instant), zone, { dateStyle: 'full', timeStyle: 'short' });
}

/** "Europe/Amsterdam" → "Europe/Amsterdam"; "America/New_York" → "America/New York". */
export function zoneName(zone: string | undefined): string {
  return (knownZone(zone) ?? Intl.DateTimeFormat().resolvedOptions().timeZone).replaceAll('_', ' ');
}

/** "9:42": minutes and seconds left, for countdowns under an hour or so. */
export function formatCountdown(ms: number): string {
  const total = Math.max(0, Math.ceil(ms / 1000));
  const minutes = Math.floor(total / 60);
  const seconds = total % 60;
  return `${minutes}:${String(seconds).padStart(2, '0')}`;
}
