import { describe, expect, it } from 'vitest';
import {
  ageFromBirthYear, BODY_MEASURES, FLEXIBILITY_INFO, FLEXIBILITY_LEVELS, PROFILE_LIMITS, profileInputSchema, profileViewSchema,
  RIDING_STYLE_LABELS, RIDING_STYLES, unitPreferenceSchema,
} from '@shared/rider';
import { problems } from './problems';

const thisYear = new Date().getUTCFullYear();

describe('profileInputSchema', () => {
  it('fills every missing field with "not known"', () => {
    expect(profileInputSchema.parse({ unit: 'mm' })).toEqual({
      unit: 'mm', height: null, inseam: null, birthYear: null, flexibility: null, ridingStyle: null,
      hoursPerWeek: null, ridesPerWeek: null, injuryHistory: '',
    });
  });

  it('keeps millimetres and rounds them to a tenth', () => {
    const parsed = profileInputSchema.parse({ unit: 'mm', height: 1780.04, inseam: 842.56 });
    expect(parsed).toMatchObject({ unit: 'mm', height: 1780, inseam: 842.6 });
  });

  it('converts a profile typed in inches to millimetres', () => {
    const parsed = profileInputSchema.parse({ unit: 'in', height: 70, inseam: 32 });
    expect(parsed).toMatchObject({ unit: 'in', height: 1778, inseam: 812.8 });
  });

  it('keeps the whole profile, trimming the injury history', () => {
    const parsed = profileInputSchema.parse({
      unit: 'mm', height: null, birthYear: 1984, flexibility: 'limited', ridingStyle: 'triathlon-tt',
      hoursPerWeek: 6.5, ridesPerWeek: 4, injuryHistory: '  Left ACL repair in 2019.\n  ',
    });
    expect(parsed).toMatchObject({ birthYear: 1984, flexibility: 'limited', ridingStyle: 'triathlon-tt', hoursPerWeek: 6.5, ridesPerWeek: 4, injuryHistory: 'Left ACL repair in 2019.', height: null });
  });

  it('quotes body limits in the unit the rider typed', () => {
    expect(problems(profileInputSchema, { unit: 'mm', height: 900, inseam: 1200 })).toEqual({
      height: 'The height must be at least 1000 mm.',
      inseam: 'The inseam must be at most 1100 mm.',
    });
    expect(problems(profileInputSchema, { unit: 'in', height: 30, inseam: 44 })).toEqual({
      height: 'The height must be at least 39.37 in.',
      inseam: 'The inseam must be at most 43.31 in.',
    });
    expect(problems(profileInputSchema, { unit: 'in', height: '5ft 10' })).toEqual({ height: 'Enter the height as a number.' });
  });

  it('accepts birth years from 1900 up to five years ago', () => {
    expect(profileInputSchema.parse({ unit: 'mm', birthYear: 1900 }).birthYear).toBe(1900);
    expect(profileInputSchema.parse({ unit: 'mm', birthYear: thisYear - 5 }).birthYear).toBe(thisYear - 5);
  });

  it.each([1899, thisYear - 4, thisYear + 1, 1984.5])('refuses %s as a birth year', (birthYear) => {
    expect(problems(profileInputSchema, { unit: 'mm', birthYear })).toEqual({ birthYear: 'Enter the year you were born, like 1984.' });
  });

  it('refuses a birth year typed as text', () => {
    expect(problems(profileInputSchema, { unit: 'mm', birthYear: '1984' })).toEqual({ birthYear: 'Enter the year you were born as a number.' });
  });

  it('refuses unknown flexibility and riding style values', () => {
    expect(problems(profileInputSchema, { unit: 'mm', flexibility: 'bendy', ridingStyle: 'bmx' })).toEqual({
      flexibility: 'Choose limited, average or good.',
      ridingStyle: 'Choose a riding style from the list.',
    });
  });

  it('keeps hours and rides per week in range', () => {
    expect(profileInputSchema.parse({ unit: 'mm', hoursPerWeek: 0, ridesPerWeek: 0 })).toMatchObject({ hoursPerWeek: 0, ridesPerWeek: 0 });
    expect(problems(profileInputSchema, { unit: 'mm', hoursPerWeek: -1, ridesPerWeek: -1 })).toEqual({
      hoursPerWeek: 'Hours per week cannot be negative.',
      ridesPerWeek: 'Rides per week cannot be negative.',
    });
    expect(problems(profileInputSchema, { unit: 'mm', hoursPerWeek: 41, ridesPerWeek: 22 })).toEqual({
      hoursPerWeek: 'Hours per week can be at most 40.',
      ridesPerWeek: 'Rides per week can be at most 21.',
    });
    expect(problems(profileInputSchema, { unit: 'mm', hoursPerWeek: 'lots', ridesPerWeek: 2.5 })).toEqual({
      hoursPerWeek: 'Enter hours per week as a number.',
      ridesPerWeek: 'Enter rides per week as a whole number.',
    });
    expect(problems(profileInputSchema, { unit: 'mm', ridesPerWeek: 'three' })).toEqual({ ridesPerWeek: 'Enter rides per week as a number.' });
  });

  it('refuses an over-long, script-like or binary injury history', () => {
    expect(problems(profileInputSchema, { unit: 'mm', injuryHistory: 'x'.repeat(PROFILE_LIMITS.injuryHistoryMax + 1) })).toEqual({
      injuryHistory: 'The injury history can be at most 2000 characters.',
    });
    expect(problems(profileInputSchema, { unit: 'mm', injuryHistory: '<img src=x onerror=alert(1)>' })).toEqual({
      injuryHistory: 'Please leave HTML tags such as <script> out of the injury history.',
    });
    expect(problems(profileInputSchema, { unit: 'mm', injuryHistory: 'knee\u0000' })).toEqual({
      injuryHistory: 'The injury history cannot contain control characters.',
    });
  });

  it('tells a missing profile apart from a missing unit', () => {
    expect(problems(profileInputSchema, null)).toEqual({ '': 'Send your profile as a set of named fields.' });
    expect(problems(profileInputSchema, [])).toEqual({ '': 'Send your profile as a set of named fields.' });
    expect(problems(profileInputSchema, { height: 1780 })).toEqual({ unit: 'Choose mm or in as the unit.' });
    expect(problems(profileInputSchema, { unit: 'cm' })).toEqual({ unit: 'Choose mm or in as the unit.' });
  });

  it('refuses smuggled fields such as the stored millimetres', () => {
    expect(problems(profileInputSchema, { unit: 'mm', heightMm: 1780 })).toEqual({ '': 'Unexpected field: heightMm.' });
  });
});

describe('unitPreferenceSchema', () => {
  it('accepts a unit and nothing else', () => {
    expect(unitPreferenceSchema.parse({ unit: 'in' })).toEqual({ unit: 'in' });
    expect(problems(unitPreferenceSchema, { unit: 'feet' })).toEqual({ unit: 'Choose mm or in as the unit.' });
    expect(problems(unitPreferenceSchema, { unit: 'mm', theme: 'dark' })).toEqual({ '': 'Unexpected field: theme.' });
  });
});

describe('profileViewSchema', () => {
  it('describes what the API returns, lengths in millimetres', () => {
    const view = {
      unit: 'in', heightMm: 1778, inseamMm: null, birthYear: 1984, flexibility: 'good', ridingStyle: 'road',
      hoursPerWeek: 5, ridesPerWeek: null, injuryHistory: '', updatedAt: null,
    };
    expect(profileViewSchema.parse(view)).toEqual(view);
    expect(profileViewSchema.safeParse({ ...view, heightMm: '1778' }).success).toBe(false);
  });
});

describe('body measures and choice labels', () => {
  it('explains how to measure height and inseam, in millimetres', () => {
    expect(BODY_MEASURES.inseam).toMatchObject({ label: 'inseam', unit: 'mm', min: 500, max: 1100 });
    expect(BODY_MEASURES.height.measure).toMatch(/barefoot/i);
  });

  it('labels every flexibility level and riding style', () => {
    expect(Object.keys(FLEXIBILITY_INFO)).toEqual([...FLEXIBILITY_LEVELS]);
    expect(Object.keys(RIDING_STYLE_LABELS).sort()).toEqual([...RIDING_STYLES].sort());
  });
});

describe('ageFromBirthYear', () => {
  const now = new Date('2027-06-15T12:00:00Z');

  it('gives whole years from the birth year', () => {
    expect(ageFromBirthYear(1970, now)).toBe(57);
    expect(ageFromBirthYear(1972, now)).toBe(55);
  });

  it('gives nothing when the birth year is unknown', () => {
    expect(ageFromBirthYear(null, now)).toBeUndefined();
  });

  it('gives nothing for an age outside 5 to 120', () => {
    expect(ageFromBirthYear(2022, now)).toBe(5);
    expect(ageFromBirthYear(2023, now)).toBeUndefined();
    expect(ageFromBirthYear(1907, now)).toBe(120);
    expect(ageFromBirthYear(1906, now)).toBeUndefined();
    expect(ageFromBirthYear(2030, now)).toBeUndefined();
  });

  it('uses today when no date is given', () => {
    expect(ageFromBirthYear(thisYear - 40)).toBe(40);
  });
});
