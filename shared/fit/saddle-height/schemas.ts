import { z } from 'zod';
import { legModelSchema } from './leg-model';

export const SADDLE_HEIGHT_METHODS = [
  'lemond-0883',
  'hamley-thomas-109',
  'ferrer-roca-range',
  'inseam-minus-100',
  'gatti-regression',
  'knee-angle-model',
] as const;
export type SaddleHeightMethod = (typeof SADDLE_HEIGHT_METHODS)[number];

/** Measuring conventions a method's own number may use. */
export const SADDLE_HEIGHT_CONVENTIONS = ['bb-to-saddle-top', 'spindle-to-saddle-top'] as const;
export type SaddleHeightConvention = (typeof SADDLE_HEIGHT_CONVENTIONS)[number];

/** TRADE.md evidence tags. */
export const EVIDENCE_TAGS = ['V', 'V2', 'D', 'CP', 'M'] as const;
export type EvidenceTag = (typeof EVIDENCE_TAGS)[number];

/** The leg model without the saddle height (the method solves for it). */
const legSchema = legModelSchema.omit({ saddleHeight: true, seatTubeAngle: true, crankLength: true, stack: true });

/** What the estimates need. Only inseam is required; every default is listed in `assumptions`. */
export const saddleHeightInputSchema = z.strictObject({
  /** Floor to crotch, barefoot, mm. */
  inseam: z.number({ error: 'Enter the inseam in millimetres.' }).min(500, 'An inseam under 500 mm is outside what these methods cover.').max(1100, 'An inseam over 1100 mm is not plausible.'),
  crankLength: z.number().min(100).max(220).optional(),
  /** Shoe + pedal + cleat stack, mm. */
  stack: z.number().min(0).max(80).optional(),
  seatTubeAngle: z.number().min(60).max(90).optional(),
  clipless: z.boolean().default(true),
  /** θmin for the Gatti regression, degrees (a dynamic angle: 30–40° per Ferrer-Roca 2012). */
  gattiKneeFlexion: z.number().min(20).max(50).default(35),
  /** Target static knee-flexion range for the leg model, degrees. */
  targetKneeFlexion: z.tuple([z.number().min(5).max(60), z.number().min(5).max(60)]).optional(),
  /** Measured leg segments; the knee-angle method runs only when these are given. */
  leg: legSchema.optional(),
});
export type SaddleHeightInput = z.input<typeof saddleHeightInputSchema>;

export const saddleHeightEstimateSchema = z.object({
  method: z.enum(SADDLE_HEIGHT_METHODS),
  label: z.string(),
  /** The convention the source states its number in. */
  convention: z.enum(SADDLE_HEIGHT_CONVENTIONS),
  /** The number in the source's own convention, mm. */
  conventionValue: z.number(),
  /** Range in the source's own convention, mm. */
  conventionRange: z.tuple([z.number(), z.number()]),
  /** BB centre to saddle top along the seat tube, mm. */
  value: z.number(),
  /** BB convention range, mm (low, high). */
  range: z.tuple([z.number(), z.number()]),
  source: z.string(),
  tag: z.enum(EVIDENCE_TAGS),
  /** How the number was reached, for the "how we got this" disclosure. */
  how: z.string(),
});
export type SaddleHeightEstimate = z.infer<typeof saddleHeightEstimateSchema>;

export const saddleHeightSummarySchema = z.object({
  estimates: z.array(saddleHeightEstimateSchema),
  /** Median of the values, mm, clamped into `suggestedRange`. */
  suggested: z.number(),
  /** Median of the lows to median of the highs, mm. */
  suggestedRange: z.tuple([z.number(), z.number()]),
  /** Largest minus smallest value, mm. */
  spread: z.number(),
  /** Spread above which the methods are said to disagree, mm. */
  disagreementThreshold: z.number(),
  disagree: z.boolean(),
  /** Defaults that were filled in, in plain words. */
  assumptions: z.array(z.string()),
});
export type SaddleHeightSummary = z.infer<typeof saddleHeightSummarySchema>;
