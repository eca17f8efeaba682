import { fromMinorUnits, minorUnitDigits, toMinorUnits, type AvailabilityInput, type Currency } from '@shared/booking';
import type { FitterSettings, FitterSettingsInput } from '@/api/fitters';

/*
 * The Availability page's form model and its conversion to and from the API. The form keeps the
 * fee in the currency's major unit (what a fitter thinks in) and each exception as one of three
 * plain choices; the API wants minor units and the closed/open kind with optional hours.
 */

export type ExceptionChoice = 'closed-day' | 'closed-hours' | 'open';

export interface WindowRow {
  key: number;
  weekday: number;
  start: string;
  end: string;
}

export interface ExceptionRow {
  key: number;
  date: string;
  choice: ExceptionChoice;
  start: string;
  end: string;
  note: string;
}

export interface ProfileForm {
  bio: string;
  specialties: string[];
  languages: string[];
  /** In the currency's major unit (euros, yen); null while the field is empty. */
  fee: number | null;
  currency: Currency;
  timeZone: string;
  published: boolean;
}

export interface RulesForm {
  slotMinutes: number;
  bufferMinutes: number;
  minNoticeHours: number;
  horizonDays: number;
}

export interface AvailabilityForm {
  profile: ProfileForm;
  windows: WindowRow[];
  exceptions: ExceptionRow[];
  rules: RulesForm;
}

let nextKey = 1;
/** Stable keys for v-for, so removing a row never re-uses another row's inputs. */
export const rowKey = (): number => nextKey++;

export function formFromSettings(settings: FitterSettings): AvailabilityForm {
  const { profile, availability } = settings;
  return {
    profile: {
      bio: profile.bio,
      specialties: [...profile.specialties],
      languages: [...profile.languages],
      fee: fromMinorUnits(profile.feeMinor, profile.currency),
      currency: profile.currency,
      timeZone: profile.timeZone,
      published: profile.published,
    },
    windows: availability.windows.map((w) => ({ key: rowKey(), ...w })),
    exceptions: availability.exceptions.map((e) => ({
      key: rowKey(),
      date: e.date,
      choice: e.kind === 'open' ? 'open' : e.start ? 'closed-hours' : 'closed-day',
      start: e.start ?? '',
      end: e.end ?? '',
      note: e.note ?? '',
    })),
    rules: {
      slotMinutes: availability.slotMinutes,
      bufferMinutes: availability.bufferMinutes,
      minNoticeHours: availability.minNoticeHours,
      horizonDays: availability.horizonDays,
    },
  };
}

export function availabilityInput(form: AvailabilityForm): AvailabilityInput {
  return {
    windows: form.windows.map(({ weekday, start, end }) => ({ weekday, start, end })),
    exceptions: form.exceptions.map((row) => {
      const hours = row.choice === 'closed-day' ? {} : { start: row.start || undefined, end: row.end || undefined };
      const note = row.note.trim();
      return { date: row.date, kind: row.choice === 'open' ? 'open' : 'closed', ...hours, ...(note ? { note } : {}) };
    }),
    ...form.rules,
  };
}

/** The request body. A missing fee becomes NaN so the shared schema reports it on the fee field. */
export function settingsInput(form: AvailabilityForm): FitterSettingsInput {
  const { fee, ...profile } = form.profile;
  return {
    profile: { ...profile, feeMinor: fee === null ? Number.NaN : toMinorUnits(fee, profile.currency) },
    availability: availabilityInput(form),
  };
}

/** Decimal places the fee field allows: none for yen or won, two for most currencies. */
export const feeDigits = (currency: string): number => minorUnitDigits(currency);
