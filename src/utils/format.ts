/** A calendar date in the viewer's own time zone, e.g. "2 Dec 2026". */
export function formatDate(iso: string, timeZone: string | undefined): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  try {
    return new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeZone }).format(date);
  } catch {
    // An unknown zone should not blank the page; fall back to the browser's zone.
    return new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' }).format(date);
  }
}

/** "1 rider", "3 riders": counts read as words, not bare numbers. */
export function plural(count: number, one: string, many = `${one}s`): string {
  return `${count} ${count === 1 ? one : many}`;
}
