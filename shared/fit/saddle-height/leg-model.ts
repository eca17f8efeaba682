/**
 * A 2D side-view leg model for the knee-angle method.
 *
 * Frame: bottom-bracket centre at the origin, x forward (toward the front wheel), y up.
 * The saddle top sits `saddleHeight` from the BB along the seat tube, which leans back at the
 * seat-tube angle (from horizontal). The hip joint centre is the saddle top plus an optional
 * measured offset. The pedal spindle is on the crank at `crankAngle` from straight down
 * (0 = 6 o'clock, the usual static measuring position). The foot stands on the pedal: the ball
 * of the foot is `stack` above the spindle, and the ankle joint is `footLength` from it along a
 * line rising backwards at `footAngle` above horizontal. Thigh (hip→knee) and shank (knee→ankle)
 * close the triangle; knee flexion = 180° − the hip–knee–ankle angle.
 */
import { z } from 'zod';
import { ensureFinite, FitInputError, parseInput } from '../errors';

export const legModelSchema = z.strictObject({
  saddleHeight: z.number().min(300).max(1100).optional(),
  seatTubeAngle: z.number().min(60).max(90),
  crankLength: z.number().min(100).max(220),
  stack: z.number().min(0).max(80),
  /** Hip joint centre to knee joint centre, mm. */
  thigh: z.number().min(200).max(700),
  /** Knee joint centre to ankle joint centre, mm. */
  shank: z.number().min(200).max(700),
  /** Ankle joint centre to the ball of the foot over the spindle, mm (0 puts the ankle on the pedal). */
  footLength: z.number().min(0).max(300).default(0),
  /** Angle of the ball-of-foot→ankle line above horizontal, degrees (heel dropped is smaller). */
  footAngle: z.number().min(-45).max(85).default(0),
  /** Crank angle from straight down, degrees, forward positive. */
  crankAngle: z.number().min(-90).max(90).default(0),
  /** Hip joint centre relative to the saddle top: forward (+x) and up (+y), mm. */
  hipForward: z.number().min(-200).max(200).default(0),
  hipAbove: z.number().min(-100).max(250).default(0),
});
export type LegModel = z.input<typeof legModelSchema>;
type LegModelParsed = z.output<typeof legModelSchema>;

export interface Point2 {
  x: number;
  y: number;
}

const rad = (deg: number) => (deg * Math.PI) / 180;
const deg = (r: number) => (r * 180) / Math.PI;

/** Ankle joint centre in the BB frame (independent of saddle height). */
function ankle(m: LegModelParsed): Point2 {
  const spindle = { x: m.crankLength * Math.sin(rad(m.crankAngle)), y: -m.crankLength * Math.cos(rad(m.crankAngle)) };
  const ball = { x: spindle.x, y: spindle.y + m.stack };
  return { x: ball.x - m.footLength * Math.cos(rad(m.footAngle)), y: ball.y + m.footLength * Math.sin(rad(m.footAngle)) };
}

/** Hip joint centre in the BB frame for a saddle height. */
function hip(m: LegModelParsed, saddleHeight: number): Point2 {
  return {
    x: -saddleHeight * Math.cos(rad(m.seatTubeAngle)) + m.hipForward,
    y: saddleHeight * Math.sin(rad(m.seatTubeAngle)) + m.hipAbove,
  };
}

/** Knee flexion for a hip–ankle distance, or null when the leg cannot form that triangle. */
function flexionForDistance(thigh: number, shank: number, d: number): number | null {
  if (d > thigh + shank || d < Math.abs(thigh - shank)) return null;
  const cosInterior = (thigh * thigh + shank * shank - d * d) / (2 * thigh * shank);
  return 180 - deg(Math.acos(Math.min(1, Math.max(-1, cosInterior))));
}

export interface LegPose {
  hip: Point2;
  knee: Point2;
  ankle: Point2;
  /** Knee flexion, degrees (0 = straight leg). */
  kneeFlexion: number;
}

/**
 * Knee flexion (degrees) at `saddleHeight` for this leg and bike. Throws FitInputError when the
 * foot cannot reach the pedal (saddle too high for these segment lengths) or the knee would
 * have to fold past its limit (saddle absurdly low).
 */
export function kneeFlexionAt(model: LegModel, saddleHeight: number): LegPose {
  const m = parseInput(legModelSchema, { ...model, saddleHeight }, 'legModel');
  const h = hip(m, saddleHeight);
  const a = ankle(m);
  const d = Math.hypot(h.x - a.x, h.y - a.y);
  const flexion = flexionForDistance(m.thigh, m.shank, d);
  if (flexion === null) {
    throw new FitInputError(
      'saddleHeight',
      d > m.thigh + m.shank
        ? `At ${saddleHeight.toFixed(1)} mm the leg cannot reach the pedal: the hip is ${d.toFixed(0)} mm from the ankle but thigh + shank is ${(m.thigh + m.shank).toFixed(0)} mm.`
        : `At ${saddleHeight.toFixed(1)} mm the knee would have to bend past its limit.`,
    );
  }
  // Knee position: the thigh rotated from the hip-ankle line by the angle at the hip.
  const cosHip = (m.thigh * m.thigh + d * d - m.shank * m.shank) / (2 * m.thigh * d);
  const hipAngle = Math.acos(Math.min(1, Math.max(-1, cosHip)));
  const dir = Math.atan2(a.y - h.y, a.x - h.x);
  // The knee bends forward (+x side of the hip-ankle line), which is a clockwise-to-counterclockwise
  // choice: rotate the hip→ankle direction toward +x.
  const kneeDir = dir + hipAngle;
  const knee = { x: h.x + m.thigh * Math.cos(kneeDir), y: h.y + m.thigh * Math.sin(kneeDir) };
  return { hip: h, knee, ankle: a, kneeFlexion: ensureFinite('kneeFlexion', flexion) };
}

/** Bisection tolerance on saddle height, mm; far below anything a rider can set. */
const HEIGHT_TOLERANCE_MM = 1e-6;

/**
 * The saddle height (BB convention, mm) at which this leg shows `targetFlexionDeg` of knee
 * flexion: a numerical inverse of kneeFlexionAt by bisection. Knee flexion falls steadily as the
 * saddle rises once the hip is above its closest approach to the ankle, so the search runs from
 * that point (or 300 mm) up to where the leg is straight, and always converges. Throws
 * FitInputError when no saddle height in 300–1100 mm gives the target.
 */
export function saddleHeightForKneeFlexion(model: LegModel, targetFlexionDeg: number): number {
  const m = parseInput(legModelSchema, model, 'legModel');
  if (!Number.isFinite(targetFlexionDeg) || targetFlexionDeg <= 0 || targetFlexionDeg >= 120) {
    throw new FitInputError('targetKneeFlexion', 'targetKneeFlexion must be between 0° and 120° (exclusive).');
  }
  const a = ankle(m);
  const u = { x: -Math.cos(rad(m.seatTubeAngle)), y: Math.sin(rad(m.seatTubeAngle)) };
  const distance = (sh: number) => {
    const h = hip(m, sh);
    return Math.hypot(h.x - a.x, h.y - a.y);
  };
  // Hip-ankle distance the target flexion needs (law of cosines, interior angle 180° − θ).
  const need = Math.sqrt(
    m.thigh ** 2 + m.shank ** 2 + 2 * m.thigh * m.shank * Math.cos(rad(targetFlexionDeg)),
  );
  // Saddle height of the hip's closest approach to the ankle; distance grows monotonically above it.
  const closest = u.x * (a.x - m.hipForward) + u.y * (a.y - m.hipAbove);
  let lo = Math.max(300, closest);
  let hi = 1100;
  if (distance(lo) > need || distance(hi) < need) {
    throw new FitInputError(
      'targetKneeFlexion',
      `No saddle height between 300 and 1100 mm gives ${targetFlexionDeg}° of knee flexion with these segment lengths.`,
    );
  }
  for (let i = 0; i < 200 && hi - lo > HEIGHT_TOLERANCE_MM; i++) {
    const mid = (lo + hi) / 2;
    if (distance(mid) < need) lo = mid;
    else hi = mid;
  }
  return ensureFinite('saddleHeight', (lo + hi) / 2);
}
