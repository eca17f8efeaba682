/** The rider's profile: body measurements, flexibility, riding and injury history. */
import { z } from 'zod';
import { LENGTH_UNITS, type LengthUnit } from '../units';
import { lengthUnitSchema, measureSchema, type MeasureInfo } from './measure';
import { plainText, strictShape, unitUnionError } from './text';

/**
 * How far apart the feet stand for the inseam, in the rider's own unit. The stance needs no
 * precision, so a round figure in each unit reads better than an exact conversion.
 */
export const INSEAM_FEET_APART: Record<LengthUnit, string> = { mm: '15 cm', in: '6 in' };

function inseamMeasure(feetApart: string): string {
  return `Barefoot, back to a wall, feet about ${feetApart} apart. Pull a hardback book up firmly between your legs, spine up and level, the way a saddle sits. Mark the top of the spine on the wall and measure from the floor to the mark. Measure twice and use the average.`;
}

/** Body measurements with their limits (typing or unit mistakes, not advice) and how to measure. */
export const BODY_MEASURES = {
  height: {
    label: 'height', unit: 'mm', min: 1000, max: 2300,
    measure: 'Stand barefoot with your back and heels against a wall. Lay a hardback book flat on your head against the wall, mark its underside, and measure from the floor to the mark.',
  },
  inseam: {
    label: 'inseam', unit: 'mm', min: 500, max: 1100,
    // Floor to crotch, barefoot: the convention of LeMond & Gordis 1987 (TRADE §1 [V]); book method [CP].
    measure: inseamMeasure(INSEAM_FEET_APART.mm),
    measureInches: inseamMeasure(INSEAM_FEET_APART.in),
  },
} as const satisfies Record<string, MeasureInfo>;

/** The how-to-measure text in the unit the rider is viewing. */
export function measureTextFor(info: MeasureInfo, unit: LengthUnit): string {
  return unit === 'in' && info.measureInches ? info.measureInches : info.measure;
}

export const FLEXIBILITY_LEVELS = ['limited', 'average', 'good'] as const;
export type Flexibility = (typeof FLEXIBILITY_LEVELS)[number];

/** A simple self-test the rider can do standing, knees straight [CP]. */
export const FLEXIBILITY_INFO: Record<Flexibility, { label: string; test: string }> = {
  limited: { label: 'Limited', test: 'Knees straight, bending forward, my fingertips stop above my ankles.' },
  average: { label: 'Average', test: 'Knees straight, I can touch my ankles or the tops of my feet.' },
  good: { label: 'Good', test: 'Knees straight, I can touch the floor.' },
};

export const RIDING_STYLES = ['road', 'gravel', 'mountain', 'commuting', 'touring', 'triathlon-tt', 'indoor'] as const;
export type RidingStyle = (typeof RIDING_STYLES)[number];
export const RIDING_STYLE_LABELS: Record<RidingStyle, string> = {
  road: 'Road',
  gravel: 'Gravel',
  mountain: 'Mountain',
  commuting: 'Commuting',
  touring: 'Touring and bikepacking',
  'triathlon-tt': 'Triathlon or time trial',
  indoor: 'Indoor trainer',
};

export const PROFILE_LIMITS = { injuryHistoryMax: 2000, hoursPerWeekMax: 40, ridesPerWeekMax: 21 } as const;

const thisYear = () => new Date().getUTCFullYear();

function profileShape(unit: (typeof LENGTH_UNITS)[number]) {
  return strictShape({
    unit: z.literal(unit),
    height: measureSchema(BODY_MEASURES.height, unit).nullable().default(null),
    inseam: measureSchema(BODY_MEASURES.inseam, unit).nullable().default(null),
    birthYear: z
      .number({ error: 'Enter the year you were born as a number.' })
      .int('Enter the year you were born, like 1984.')
      .min(1900, 'Enter the year you were born, like 1984.')
      .refine((y) => y <= thisYear() - 5, 'Enter the year you were born, like 1984.')
      .nullable()
      .default(null),
    flexibility: z.enum(FLEXIBILITY_LEVELS, { error: 'Choose limited, average or good.' }).nullable().default(null),
    ridingStyle: z.enum(RIDING_STYLES, { error: 'Choose a riding style from the list.' }).nullable().default(null),
    hoursPerWeek: z
      .number({ error: 'Enter hours per week as a number.' })
      .min(0, 'Hours per week cannot be negative.')
      .max(PROFILE_LIMITS.hoursPerWeekMax, `Hours per week can be at most ${PROFILE_LIMITS.hoursPerWeekMax}.`)
      .nullable()
      .default(null),
    ridesPerWeek: z
      .number({ error: 'Enter rides per week as a number.' })
      .int('Enter rides per week as a whole number.')
      .min(0, 'Rides per week cannot be negative.')
      .max(PROFILE_LIMITS.ridesPerWeekMax, `Rides per week can be at most ${PROFILE_LIMITS.ridesPerWeekMax}.`)
      .nullable()
      .default(null),
    injuryHistory: plainText('injury history', PROFILE_LIMITS.injuryHistoryMax).default(''),
  });
}

/**
 * PUT /api/rider/profile. Lengths are typed in `unit` (which also becomes the rider's display
 * preference) and come out in millimetres as `height`/`inseam`. Missing fields mean "not known".
 */
export const profileInputSchema = z.discriminatedUnion('unit', [profileShape('mm'), profileShape('in')], {
  error: unitUnionError('your profile'),
});
export type ProfileInput = z.input<typeof profileInputSchema>;
export type ProfileParsed = z.output<typeof profileInputSchema>;

export const unitPreferenceSchema = strictShape({ unit: lengthUnitSchema });

/** What the API returns: lengths always in millimetres, plus the display preference. */
export const profileViewSchema = z.object({
  unit: z.enum(LENGTH_UNITS),
  heightMm: z.number().nullable(),
  inseamMm: z.number().nullable(),
  birthYear: z.number().nullable(),
  flexibility: z.enum(FLEXIBILITY_LEVELS).nullable(),
  ridingStyle: z.enum(RIDING_STYLES).nullable(),
  hoursPerWeek: z.number().nullable(),
  ridesPerWeek: z.number().nullable(),
  injuryHistory: z.string(),
  updatedAt: z.string().nullable(),
});
export type ProfileView = z.infer<typeof profileViewSchema>;

/** Age in whole years from a birth year (a year's precision is all the Ottawa rule needs). */
export function ageFromBirthYear(birthYear: number | null, now = new Date()): number | undefined {
  if (birthYear === null) return undefined;
  const age = now.getUTCFullYear() - birthYear;
  return age >= 5 && age <= 120 ? age : undefined;
}
