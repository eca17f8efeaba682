import { z } from 'zod';

/** Pixel coordinates in the image: x to the right, y down (as browsers and cameras give them). */
export const pixelPointSchema = z.strictObject({
  x: z.number().min(-100_000).max(100_000),
  y: z.number().min(-100_000).max(100_000),
});
export type PixelPoint = z.infer<typeof pixelPointSchema>;

/**
 * The points the workspace marks on a side-view photo. Landmarks (our choice, stated for the fitter):
 * - hip: greater trochanter; knee: lateral femoral epicondyle (knee joint centre);
 * - ankle: lateral malleolus; kneeFront: the front of the knee (or the tibial tuberosity);
 * - spindle: pedal-spindle centre; shoulder: acromion (optional, for the hip angle);
 * - toe: fifth metatarsal head (optional, for the ankle angle);
 * - bottomBracket: bottom-bracket centre (optional, to check the cranks are level for the offset).
 */
export const photoPointsSchema = z.strictObject({
  hip: pixelPointSchema.optional(),
  knee: pixelPointSchema.optional(),
  ankle: pixelPointSchema.optional(),
  kneeFront: pixelPointSchema.optional(),
  spindle: pixelPointSchema.optional(),
  shoulder: pixelPointSchema.optional(),
  toe: pixelPointSchema.optional(),
  bottomBracket: pixelPointSchema.optional(),
});
export type PhotoPoints = z.infer<typeof photoPointsSchema>;

/** A known length in the picture, marked by its two ends. */
export const scaleReferenceSchema = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('wheel'),
    /** ISO 5775 size, e.g. 25-622. */
    tyre: z.string().max(20),
    /** Which diameter the two marks span: the rim's bead seat or the tyre's outside. */
    diameter: z.enum(['bead-seat', 'outside']),
    from: pixelPointSchema,
    to: pixelPointSchema,
  }),
  z.strictObject({
    kind: z.literal('crank'),
    /** BB centre to pedal-spindle centre, mm. */
    crankLength: z.number().min(100).max(220),
    from: pixelPointSchema,
    to: pixelPointSchema,
  }),
  z.strictObject({
    kind: z.literal('known'),
    lengthMm: z.number().min(10).max(3000),
    /** Uncertainty of the length itself, mm. */
    toleranceMm: z.number().min(0).max(100).default(0),
    from: pixelPointSchema,
    to: pixelPointSchema,
  }),
]);
export type ScaleReference = z.input<typeof scaleReferenceSchema>;

export const photoMeasurementInputSchema = z.strictObject({
  points: photoPointsSchema,
  scale: scaleReferenceSchema.optional(),
  /** Which way the rider faces in the picture, to sign the knee-to-spindle offset. */
  facing: z.enum(['left', 'right']),
  /** Click precision, ± pixels per marked point. */
  clickPrecisionPx: z.number().min(0).max(50).default(2),
});
export type PhotoMeasurementInput = z.input<typeof photoMeasurementInputSchema>;

const withUncertainty = z.object({ value: z.number(), plusMinus: z.number() });
export type ValueWithUncertainty = z.infer<typeof withUncertainty>;

export const photoMeasurementSchema = z.object({
  mmPerPixel: withUncertainty.nullable(),
  /** 180° − hip–knee–ankle angle. */
  kneeFlexion: withUncertainty.nullable(),
  /** Included angle shoulder–hip–knee, degrees. */
  hipAngle: withUncertainty.nullable(),
  /** Included angle knee–ankle–toe, degrees. */
  ankleAngle: withUncertainty.nullable(),
  /** Horizontal knee-front to spindle offset, mm; positive = knee ahead of the spindle. */
  kneeToSpindleMm: withUncertainty.nullable(),
  thighMm: withUncertainty.nullable(),
  shankMm: withUncertainty.nullable(),
  notes: z.array(z.string()),
});
export type PhotoMeasurement = z.infer<typeof photoMeasurementSchema>;
