/** Bikes and their setup history (append-only snapshots, in millimetres and degrees). */
import { z } from 'zod';
import { setupSchema, isoDateSchema } from '../fit/setup';
import { setupInUnitSchema } from './measure';
import { plainText, strictShape, unitUnionError } from './text';

export const BIKE_KINDS = ['road', 'gravel', 'mountain', 'hybrid', 'tt-triathlon', 'touring', 'other'] as const;
export type BikeKind = (typeof BIKE_KINDS)[number];
export const BIKE_KIND_LABELS: Record<BikeKind, string> = {
  road: 'Road',
  gravel: 'Gravel',
  mountain: 'Mountain',
  hybrid: 'Hybrid or city',
  'tt-triathlon': 'Time trial or triathlon',
  touring: 'Touring',
  other: 'Other',
};

/**
 * Where a snapshot came from: the first measured setup, a plan step applied, a "go back to this",
 * or a re-measure by the rider. Later features add 'step' and 'revert' rows.
 */
export const SNAPSHOT_SOURCES = ['baseline', 'step', 'revert', 'manual'] as const;
export type SnapshotSource = (typeof SNAPSHOT_SOURCES)[number];

export const BIKE_LIMITS = { nameMax: 60, notesMax: 500, cleatNotesMax: 500, bikesPerRider: 10 } as const;

const bikeName = plainText('bike name', BIKE_LIMITS.nameMax).pipe(z.string().min(1, 'Give the bike a name, like "Blue road bike".'));

/**
 * Today or earlier, so a snapshot is never dated in the future. "Today" is the latest calendar day
 * anywhere (UTC+14), so a rider east of UTC can enter their own local date.
 */
/** The calendar date in the most-advanced time zone (UTC+14). */
export function latestTodayAnywhere(now = Date.now()): string {
  return new Date(now + 14 * 3_600_000).toISOString().slice(0, 10);
}

const takenOn = z
  .string({ error: 'Enter the date you measured it, like 2026-03-01.' })
  .pipe(isoDateSchema)
  .refine((d) => d <= latestTodayAnywhere(), 'The date cannot be in the future.');

function snapshotShape<U extends 'mm' | 'in'>(unit: U) {
  return strictShape({
    unit: z.literal(unit),
    setup: setupInUnitSchema(unit),
    cleatNotes: plainText('cleat notes', BIKE_LIMITS.cleatNotesMax).default(''),
    takenOn,
  });
}

/** A measured setup typed in mm or inches (degrees stay degrees); output in millimetres. */
export const snapshotInputSchema = z.discriminatedUnion('unit', [snapshotShape('mm'), snapshotShape('in')], {
  error: unitUnionError('the measured setup'),
});
export type SnapshotInput = z.input<typeof snapshotInputSchema>;
export type SnapshotParsed = z.output<typeof snapshotInputSchema>;

export const bikeCreateSchema = strictShape({
  name: bikeName,
  kind: z.enum(BIKE_KINDS, { error: 'Choose the kind of bike from the list.' }),
  notes: plainText('bike notes', BIKE_LIMITS.notesMax).default(''),
  baseline: snapshotInputSchema,
});
export type BikeCreateInput = z.input<typeof bikeCreateSchema>;
export type BikeCreateParsed = z.output<typeof bikeCreateSchema>;

export const bikeUpdateSchema = strictShape({
  name: bikeName.optional(),
  kind: z.enum(BIKE_KINDS, { error: 'Choose the kind of bike from the list.' }).optional(),
  notes: plainText('bike notes', BIKE_LIMITS.notesMax).optional(),
}).refine((v) => Object.keys(v).length > 0, 'Change at least one of name, kind or notes.');
export type BikeUpdateParsed = z.output<typeof bikeUpdateSchema>;

export const snapshotViewSchema = z.object({
  id: z.number(),
  bikeId: z.number(),
  setup: setupSchema,
  cleatNotes: z.string(),
  source: z.enum(SNAPSHOT_SOURCES),
  stepId: z.number().nullable(),
  basedOnSnapshotId: z.number().nullable(),
  takenOn: z.string(),
  createdById: z.number(),
  createdAt: z.string(),
});
export type SnapshotView = z.infer<typeof snapshotViewSchema>;

export const bikeViewSchema = z.object({
  id: z.number(),
  name: z.string(),
  kind: z.enum(BIKE_KINDS),
  notes: z.string(),
  createdAt: z.string(),
  /** The newest snapshot: what is on the bike now. */
  current: snapshotViewSchema.nullable(),
  snapshotCount: z.number(),
});
export type BikeView = z.infer<typeof bikeViewSchema>;
