import { DateTime } from 'luxon';
import type { Availability } from './availability';

export interface BusyInterval {
  start: Date;
  end: Date;
}

export interface Slot {
  /** UTC instants; the client shows them in the viewer's own zone. */
  start: string;
  end: string;
}

export interface SlotQuery {
  availability: Availability;
  /** The fitter's IANA zone: weekly windows are wall-clock times there. */
  timeZone: string;
  busy: BusyInterval[];
  now: Date;
  /** First and last local dates (in the fitter's zone) to offer, inclusive. */
  fromDate: string;
  toDate: string;
}

/** Wall-clock minutes on a local date, or null when that time does not exist (spring-forward gap). */
function localInstant(date: DateTime, minutes: number): DateTime | null {
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  const dt = h === 24 ? date.plus({ days: 1 }).startOf('day') : date.set({ hour: h, minute: m, second: 0, millisecond: 0 });
  if (h !== 24 && (dt.hour !== h || dt.minute !== m)) return null;
  return dt;
}

/** Open hours on one local date: weekly windows, minus closures, plus extra openings. */
function openRanges(date: DateTime, availability: Availability): [number, number][] {
  const iso = date.toISODate()!;
  const exceptions = availability.exceptions.filter((e) => e.date === iso);
  if (exceptions.some((e) => e.kind === 'closed' && e.start === undefined)) {
    return exceptions.filter((e) => e.kind === 'open').map((e) => [e.start!, e.end!]);
  }
  let ranges: [number, number][] = availability.windows.filter((w) => w.weekday === date.weekday).map((w) => [w.start, w.end]);
  for (const closed of exceptions.filter((e) => e.kind === 'closed')) {
    ranges = ranges.flatMap(([s, e]): [number, number][] => {
      if (closed.end! <= s || closed.start! >= e) return [[s, e]];
      const parts: [number, number][] = [];
      if (closed.start! > s) parts.push([s, closed.start!]);
      if (closed.end! < e) parts.push([closed.end!, e]);
      return parts;
    });
  }
  for (const open of exceptions.filter((e) => e.kind === 'open')) ranges.push([open.start!, open.end!]);
  return ranges.sort((a, b) => a[0] - b[0]);
}

/**
 * Bookable slots. A slot fits inside an open range, starts after the minimum notice, and keeps
 * the buffer clear of every busy interval on both sides. Weekly windows are the fitter's wall
 * clock, so a 09:00 window stays 09:00 local across daylight-saving changes; a time that does not
 * exist on a spring-forward day is skipped rather than shifted.
 */
export function availableSlots(query: SlotQuery): Slot[] {
  const { availability, timeZone, busy, now } = query;
  const earliest = now.getTime() + availability.minNoticeHours * 3_600_000;
  const bufferMs = availability.bufferMinutes * 60_000;
  const slotMs = availability.slotMinutes * 60_000;
  const slots: Slot[] = [];
  let date = DateTime.fromISO(query.fromDate, { zone: timeZone }).startOf('day');
  const last = DateTime.fromISO(query.toDate, { zone: timeZone }).startOf('day');
  if (!date.isValid || !last.isValid) return [];

  for (let guard = 0; date <= last && guard < 400; guard += 1, date = date.plus({ days: 1 })) {
    for (const [rangeStart, rangeEnd] of openRanges(date, availability)) {
      const rangeEndAt = localInstant(date, rangeEnd);
      for (let minute = rangeStart; minute + availability.slotMinutes <= rangeEnd; minute += availability.slotMinutes + availability.bufferMinutes) {
        const startAt = localInstant(date, minute);
        if (!startAt || !rangeEndAt) continue;
        const start = startAt.toMillis();
        const end = start + slotMs;
        if (end > rangeEndAt.toMillis()) continue;
        if (start < earliest) continue;
        const clashes = busy.some((b) => start < b.end.getTime() + bufferMs && b.start.getTime() - bufferMs < end);
        if (clashes) continue;
        slots.push({ start: new Date(start).toISOString(), end: new Date(end).toISOString() });
      }
    }
  }
  return slots;
}

/**
 * The last local date (fitter's zone) on which slots are offered: today plus `horizonDays`, the
 * same rule the slot listing uses.
 */
export function horizonLastDate(availability: Availability, timeZone: string, now: Date): string {
  return DateTime.fromJSDate(now, { zone: timeZone }).plus({ days: availability.horizonDays }).toISODate()!;
}

/**
 * True when `start` is exactly one of the slots offered on its local date, within the booking
 * horizon (re-checked on every write).
 */
export function isOfferedSlot(query: Omit<SlotQuery, 'fromDate' | 'toDate'>, start: Date): boolean {
  const local = DateTime.fromJSDate(start, { zone: query.timeZone });
  const day = local.toISODate();
  if (!day) return false;
  if (day > horizonLastDate(query.availability, query.timeZone, query.now)) return false;
  // A slot may belong to the previous local day when a window runs past midnight.
  const from = local.minus({ days: 1 }).toISODate()!;
  return availableSlots({ ...query, fromDate: from, toDate: day }).some((slot) => slot.start === start.toISOString());
}

export type SlotRefusal = 'past' | 'notice' | 'beyond-horizon' | 'not-offered' | 'taken';

/**
 * Why `start` cannot be booked, or null when it can. Distinguishes a time that was never offered
 * (off the grid, outside the hours, past the horizon or inside the notice) from one that was
 * offered but is now taken, so the rider gets the right explanation.
 */
export function slotRefusal(query: Omit<SlotQuery, 'fromDate' | 'toDate'>, start: Date): SlotRefusal | null {
  if (start.getTime() <= query.now.getTime()) return 'past';
  const day = DateTime.fromJSDate(start, { zone: query.timeZone }).toISODate();
  if (!day || day > horizonLastDate(query.availability, query.timeZone, query.now)) return 'beyond-horizon';
  if (!isOfferedSlot({ ...query, busy: [] }, start)) {
    return start.getTime() < query.now.getTime() + query.availability.minNoticeHours * 3_600_000 ? 'notice' : 'not-offered';
  }
  return isOfferedSlot(query, start) ? null : 'taken';
}
