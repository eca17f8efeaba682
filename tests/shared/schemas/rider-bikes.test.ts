import { describe, expect, it } from 'vitest';
import {
  BIKE_KIND_LABELS, BIKE_KINDS, BIKE_LIMITS, bikeCreateSchema, bikeUpdateSchema, bikeViewSchema, snapshotInputSchema, snapshotViewSchema,
} from '@shared/rider';
import { problems, todayUtc } from './problems';

const mmSetup = { saddleHeight: 742.96, saddleSetback: 63.5, saddleTilt: -1.5, reach: 508, drop: 76.2, stemLength: 100, spacerStack: 25, crankLength: 172.5, stack: 20, cleatForeAft: 0, cleatRotation: 3 };
const inSetup = { saddleHeight: 29.25, saddleSetback: 2.5, saddleTilt: -1.5, reach: 20, drop: 3, stemLength: 4, spacerStack: 1, crankLength: 6.79, stack: 0.8, cleatForeAft: -0.1, cleatRotation: 3 };
const storedFromInches = { saddleHeight: 743, saddleSetback: 63.5, saddleTilt: -1.5, reach: 508, drop: 76.2, stemLength: 101.6, spacerStack: 25.4, crankLength: 172.5, stack: 20.3, cleatForeAft: -2.5, cleatRotation: 3 };

describe('snapshotInputSchema', () => {
  it('stores a setup typed in millimetres, rounded to a tenth, with empty cleat notes', () => {
    const parsed = snapshotInputSchema.parse({ unit: 'mm', setup: mmSetup, takenOn: '2026-03-01' });
    expect(parsed).toEqual({ unit: 'mm', setup: { ...mmSetup, saddleHeight: 743 }, cleatNotes: '', takenOn: '2026-03-01' });
  });

  it('converts a setup typed in inches to millimetres, degrees unchanged', () => {
    const parsed = snapshotInputSchema.parse({ unit: 'in', setup: inSetup, takenOn: '2026-03-01', cleatNotes: '  2 mm shims  ' });
    expect(parsed.setup).toEqual(storedFromInches);
    expect(parsed.cleatNotes).toBe('2 mm shims');
  });

  it('accepts a setup measured today', () => {
    expect(snapshotInputSchema.parse({ unit: 'mm', setup: mmSetup, takenOn: todayUtc() }).takenOn).toBe(todayUtc());
  });

  it('refuses a date in the future', () => {
    expect(problems(snapshotInputSchema, { unit: 'mm', setup: mmSetup, takenOn: todayUtc(2) })).toEqual({ takenOn: 'The date cannot be in the future.' });
  });

  it('refuses a missing, malformed or impossible date', () => {
    expect(problems(snapshotInputSchema, { unit: 'mm', setup: mmSetup })).toEqual({ takenOn: 'Enter the date you measured it, like 2026-03-01.' });
    expect(problems(snapshotInputSchema, { unit: 'mm', setup: mmSetup, takenOn: '1/3/2026' })).toEqual({ takenOn: 'Use a date like 2025-03-01.' });
    expect(problems(snapshotInputSchema, { unit: 'mm', setup: mmSetup, takenOn: '2026-02-30' })).toEqual({ takenOn: 'That date does not exist.' });
  });

  it('reads the numbers in the unit chosen, so inches typed as mm are out of range', () => {
    expect(problems(snapshotInputSchema, { unit: 'mm', setup: inSetup, takenOn: '2026-03-01' })).toMatchObject({
      'setup.saddleHeight': 'The saddle height must be at least 300 mm.',
      'setup.crankLength': 'The crank length must be at least 100 mm.',
    });
  });

  it('refuses cleat notes with markup or over the limit', () => {
    expect(problems(snapshotInputSchema, { unit: 'mm', setup: mmSetup, takenOn: '2026-03-01', cleatNotes: '<b>wedge</b>' })).toEqual({
      cleatNotes: 'Please leave HTML tags such as <script> out of the cleat notes.',
    });
    expect(problems(snapshotInputSchema, { unit: 'mm', setup: mmSetup, takenOn: '2026-03-01', cleatNotes: 'x'.repeat(BIKE_LIMITS.cleatNotesMax + 1) })).toEqual({
      cleatNotes: 'The cleat notes can be at most 500 characters.',
    });
  });

  it('tells a missing setup apart from a missing unit', () => {
    expect(problems(snapshotInputSchema, 'saddle 743')).toEqual({ '': 'Send the measured setup as a set of named fields.' });
    expect(problems(snapshotInputSchema, { setup: mmSetup, takenOn: '2026-03-01' })).toEqual({ unit: 'Choose mm or in as the unit.' });
    expect(problems(snapshotInputSchema, { unit: 'cm', setup: mmSetup, takenOn: '2026-03-01' })).toEqual({ unit: 'Choose mm or in as the unit.' });
  });

  it('refuses a snapshot source or extra field sent by the client', () => {
    expect(problems(snapshotInputSchema, { unit: 'mm', setup: mmSetup, takenOn: '2026-03-01', source: 'step' })).toEqual({ '': 'Unexpected field: source.' });
  });
});

describe('bikeCreateSchema', () => {
  const baseline = { unit: 'in', setup: inSetup, takenOn: '2026-03-01' };

  it('creates a bike with a trimmed name, empty notes and a baseline in millimetres', () => {
    const parsed = bikeCreateSchema.parse({ name: '  Blue road bike ', kind: 'road', baseline });
    expect(parsed).toEqual({
      name: 'Blue road bike', kind: 'road', notes: '',
      baseline: { unit: 'in', setup: storedFromInches, cleatNotes: '', takenOn: '2026-03-01' },
    });
  });

  it('asks for a name when it is blank after trimming', () => {
    expect(problems(bikeCreateSchema, { name: '   ', kind: 'road', baseline })).toEqual({ name: 'Give the bike a name, like "Blue road bike".' });
  });

  it('refuses a name that is too long, not text or looks like a script', () => {
    expect(problems(bikeCreateSchema, { name: 'x'.repeat(BIKE_LIMITS.nameMax + 1), kind: 'road', baseline })).toEqual({ name: 'The bike name can be at most 60 characters.' });
    expect(problems(bikeCreateSchema, { name: 7, kind: 'road', baseline })).toEqual({ name: 'Enter the bike name as text.' });
    expect(problems(bikeCreateSchema, { name: '<script>', kind: 'road', baseline })).toEqual({ name: 'Please leave HTML tags such as <script> out of the bike name.' });
  });

  it('refuses an unknown kind, bad notes and a missing baseline together', () => {
    expect(problems(bikeCreateSchema, { name: 'Blue', kind: 'bmx', notes: 'a\u0000b' })).toEqual({
      kind: 'Choose the kind of bike from the list.',
      notes: 'The bike notes cannot contain control characters.',
      baseline: 'Send the measured setup as a set of named fields.',
    });
  });

  it('refuses extra fields and non-objects', () => {
    expect(problems(bikeCreateSchema, { name: 'Blue', kind: 'road', baseline, riderId: 9 })).toEqual({ '': 'Unexpected field: riderId.' });
    expect(problems(bikeCreateSchema, null)).toEqual({ '': 'Send the form as a set of named fields.' });
  });
});

describe('bikeUpdateSchema', () => {
  it('accepts any one of name, kind or notes', () => {
    expect(bikeUpdateSchema.parse({ name: ' Winter bike ' })).toEqual({ name: 'Winter bike' });
    expect(bikeUpdateSchema.parse({ kind: 'gravel' })).toEqual({ kind: 'gravel' });
    expect(bikeUpdateSchema.parse({ notes: '' })).toEqual({ notes: '' });
  });

  it('asks for at least one change', () => {
    expect(problems(bikeUpdateSchema, {})).toEqual({ '': 'Change at least one of name, kind or notes.' });
  });

  it('refuses a blank name, an unknown kind and fields that cannot be changed here', () => {
    expect(problems(bikeUpdateSchema, { name: '  ', kind: 'unicycle' })).toEqual({
      name: 'Give the bike a name, like "Blue road bike".',
      kind: 'Choose the kind of bike from the list.',
    });
    expect(problems(bikeUpdateSchema, { baseline: {} })).toEqual({ '': 'Unexpected field: baseline.' });
    expect(problems(bikeUpdateSchema, { notes: 'x'.repeat(BIKE_LIMITS.notesMax + 1) })).toEqual({ notes: 'The bike notes can be at most 500 characters.' });
  });
});

describe('bike and snapshot views', () => {
  const snapshot = {
    id: 3, bikeId: 1, setup: storedFromInches, cleatNotes: '', source: 'baseline', stepId: null, basedOnSnapshotId: null,
    takenOn: '2026-03-01', createdById: 7, createdAt: '2026-03-01T10:00:00.000Z',
  };

  it('describe a bike with its current setup', () => {
    const bike = { id: 1, name: 'Blue', kind: 'road', notes: '', createdAt: '2026-03-01T10:00:00.000Z', current: snapshot, snapshotCount: 1 };
    expect(bikeViewSchema.parse(bike)).toEqual(bike);
    expect(bikeViewSchema.parse({ ...bike, current: null }).current).toBeNull();
  });

  it('know only the documented snapshot sources', () => {
    for (const source of ['baseline', 'step', 'revert', 'manual']) expect(snapshotViewSchema.safeParse({ ...snapshot, source }).success).toBe(true);
    expect(snapshotViewSchema.safeParse({ ...snapshot, source: 'import' }).success).toBe(false);
  });

  it('label every kind of bike', () => {
    expect(Object.keys(BIKE_KIND_LABELS)).toEqual([...BIKE_KINDS]);
  });
});
