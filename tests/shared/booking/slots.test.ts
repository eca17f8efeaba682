import { describe, expect, it } from 'vitest';
import { availabilitySchema, availableSlots, isOfferedSlot, type AvailabilityInput } from '@shared/booking';

const week = (overrides: Partial<AvailabilityInput> = {}) =>
  availabilitySchema.parse({
    windows: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '09:00', end: '12:00' })),
    exceptions: [],
    slotMinutes: 60,
    bufferMinutes: 0,
    minNoticeHours: 0,
    ...overrides,
  });

const longAgo = new Date('2020-01-01T00:00:00Z');

describe('availableSlots', () => {
  it('offers wall-clock slots in the fitter zone, converted to UTC', () => {
    const slots = availableSlots({ availability: week(), timeZone: 'Europe/London', busy: [], now: longAgo, fromDate: '2027-01-11', toDate: '2027-01-11' });
    // London is on GMT (UTC+0) in January.
    expect(slots.map((s) => s.start)).toEqual(['2027-01-11T09:00:00.000Z', '2027-01-11T10:00:00.000Z', '2027-01-11T11:00:00.000Z']);
  });

  it('keeps 09:00 local across the spring daylight-saving change (Europe/Berlin, 28 March 2027)', () => {
    // EU summer time starts on the last Sunday of March: 2027-03-28, clocks go 02:00 → 03:00.
    const slots = availableSlots({ availability: week(), timeZone: 'Europe/Berlin', busy: [], now: longAgo, fromDate: '2027-03-27', toDate: '2027-03-29' });
    const firstEachDay = [slots[0], slots[3], slots[6]].map((s) => s!.start);
    expect(firstEachDay).toEqual(['2027-03-27T08:00:00.000Z', '2027-03-28T07:00:00.000Z', '2027-03-29T07:00:00.000Z']);
  });

  it('keeps 09:00 local across the autumn change in New York (7 November 2027)', () => {
    // US daylight time ends on the first Sunday of November: 2027-11-07.
    const slots = availableSlots({ availability: week({ windows: [{ weekday: 6, start: '09:00', end: '10:00' }, { weekday: 1, start: '09:00', end: '10:00' }] }), timeZone: 'America/New_York', busy: [], now: longAgo, fromDate: '2027-11-06', toDate: '2027-11-08' });
    expect(slots.map((s) => s.start)).toEqual(['2027-11-06T13:00:00.000Z', '2027-11-08T14:00:00.000Z']);
  });

  it('skips a slot that falls in the spring-forward gap instead of shifting it', () => {
    const availability = week({ windows: [{ weekday: 7, start: '01:30', end: '04:00' }], slotMinutes: 30 });
    const slots = availableSlots({ availability, timeZone: 'Europe/Berlin', busy: [], now: longAgo, fromDate: '2027-03-28', toDate: '2027-03-28' });
    // 01:30 (UTC+1), then 02:00 and 02:30 do not exist, then 03:00 … 03:30 (UTC+2).
    expect(slots.map((s) => s.start)).toEqual(['2027-03-28T00:30:00.000Z', '2027-03-28T01:00:00.000Z', '2027-03-28T01:30:00.000Z']);
  });

  it('keeps the buffer clear around busy time and after each slot', () => {
    const availability = week({ bufferMinutes: 15, slotMinutes: 45 });
    const busy = [{ start: new Date('2027-01-11T10:00:00Z'), end: new Date('2027-01-11T10:45:00Z') }];
    const slots = availableSlots({ availability, timeZone: 'UTC', busy, now: longAgo, fromDate: '2027-01-11', toDate: '2027-01-11' });
    // Candidates 09:00, 10:00, 11:00 (45 min + 15 min buffer); 10:00 is busy; 09:00 ends 09:45 + 15 buffer = 10:00 OK.
    expect(slots.map((s) => s.start)).toEqual(['2027-01-11T09:00:00.000Z', '2027-01-11T11:00:00.000Z']);
  });

  it('honours the minimum notice', () => {
    const now = new Date('2027-01-11T08:30:00Z');
    const slots = availableSlots({ availability: week({ minNoticeHours: 2 }), timeZone: 'UTC', busy: [], now, fromDate: '2027-01-11', toDate: '2027-01-11' });
    expect(slots.map((s) => s.start)).toEqual(['2027-01-11T11:00:00.000Z']);
  });

  it('applies a closed day, closed hours and extra opening hours', () => {
    const availability = week({
      exceptions: [
        { date: '2027-01-11', kind: 'closed' },
        { date: '2027-01-12', kind: 'closed', start: '10:00', end: '11:00' },
        { date: '2027-01-13', kind: 'open', start: '14:00', end: '15:00' },
      ],
    });
    const slots = availableSlots({ availability, timeZone: 'UTC', busy: [], now: longAgo, fromDate: '2027-01-11', toDate: '2027-01-13' });
    expect(slots.map((s) => s.start)).toEqual([
      '2027-01-12T09:00:00.000Z',
      '2027-01-12T11:00:00.000Z',
      '2027-01-13T09:00:00.000Z',
      '2027-01-13T10:00:00.000Z',
      '2027-01-13T11:00:00.000Z',
      '2027-01-13T14:00:00.000Z',
    ]);
  });

  it('returns nothing for an invalid date range', () => {
    expect(availableSlots({ availability: week(), timeZone: 'UTC', busy: [], now: longAgo, fromDate: 'nope', toDate: '2027-01-01' })).toEqual([]);
  });
});

describe('isOfferedSlot', () => {
  // A week before the day asked about, well inside the default 42-day booking horizon.
  const base = { availability: week(), timeZone: 'Europe/Berlin', busy: [], now: new Date('2027-03-22T00:00:00Z') };
  it('accepts an offered start and refuses an off-grid one', () => {
    expect(isOfferedSlot(base, new Date('2027-03-29T07:00:00Z'))).toBe(true);
    expect(isOfferedSlot(base, new Date('2027-03-29T07:30:00Z'))).toBe(false);
    expect(isOfferedSlot(base, new Date('2027-03-29T06:00:00Z'))).toBe(false);
  });

  it('refuses a start past the booking horizon, even on the grid', () => {
    expect(isOfferedSlot({ ...base, now: longAgo }, new Date('2027-03-29T07:00:00Z'))).toBe(false);
    expect(isOfferedSlot({ ...base, availability: week({ horizonDays: 7 }) }, new Date('2027-03-29T07:00:00Z'))).toBe(true);
    expect(isOfferedSlot({ ...base, availability: week({ horizonDays: 6 }) }, new Date('2027-03-29T07:00:00Z'))).toBe(false);
  });
});

describe('availabilitySchema', () => {
  it('refuses a window that ends before it starts, with a clear message', () => {
    const result = availabilitySchema.safeParse({ windows: [{ weekday: 1, start: '12:00', end: '09:00' }], exceptions: [], slotMinutes: 60, bufferMinutes: 0, minNoticeHours: 0 });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toBe('A window must end after it starts.');
  });

  it('refuses malformed times and dates', () => {
    const bad = availabilitySchema.safeParse({ windows: [{ weekday: 8, start: '9am', end: '25:00' }], exceptions: [{ date: '2027-02-30', kind: 'closed' }], slotMinutes: 5, bufferMinutes: 0, minNoticeHours: 0 });
    expect(bad.success).toBe(false);
    const messages = bad.error!.issues.map((i) => i.message);
    expect(messages).toEqual(expect.arrayContaining(['Choose a weekday.', 'Use a time like 09:30.', 'That date does not exist.', 'Sessions last at least 15 minutes.']));
  });

  it('needs hours for an extra opening, and both ends for closed hours', () => {
    const base = { windows: [], slotMinutes: 60, bufferMinutes: 0, minNoticeHours: 0 };
    expect(availabilitySchema.safeParse({ ...base, exceptions: [{ date: '2027-01-01', kind: 'open' }] }).success).toBe(false);
    expect(availabilitySchema.safeParse({ ...base, exceptions: [{ date: '2027-01-01', kind: 'closed', start: '10:00' }] }).success).toBe(false);
    expect(availabilitySchema.safeParse({ ...base, exceptions: [{ date: '2027-01-01', kind: 'closed', start: '10:00', end: '09:00' }] }).success).toBe(false);
  });
});
