/**
 * True when `zone` is an IANA time-zone name the runtime knows (for example `Europe/Oslo`).
 * Uses Intl, which both browsers and Node provide, so no zone list has to be shipped.
 */
export function isIanaTimeZone(zone: string): boolean {
  if (!/^[A-Za-z_]+(?:\/[A-Za-z0-9_+-]+){0,2}$/.test(zone) && zone !== 'UTC') return false;
  try {
    new Intl.DateTimeFormat('en', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}
