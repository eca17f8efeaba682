/** Static-vs-dynamic and 2D-vs-3D knee-angle guidance. */
import { requireRange } from '../errors';

/**
 * At the bottom of the stroke the static knee-flexion angle was 8.2 ± 5° (mean ± SD) smaller than
 * while pedalling (the knee is straighter when still); at 3 o'clock the difference was under 1.4°.
 * Bini & Hume 2016, Human Movement 17(1):36–42 [V].
 */
export const STATIC_TO_DYNAMIC_KNEE_DEG = { mean: 8.2, sd: 5, atThreeOClockMax: 1.4 } as const;

/** 2D video underestimates the 3D knee angle by about 2.2°. Fonda, Sarabon & Li 2014, J Sports Sci 32(10):940–946 [V]. */
export const VIDEO_2D_UNDERESTIMATE_DEG = 2.2;

/** The note shown beside any knee angle measured on a still photo. */
export const STATIC_DYNAMIC_NOTE =
  'A still photo shows the knee differently from pedalling: at the bottom of the stroke the static knee flexion ' +
  'was on average 8.2° (± 5°) less than while pedalling (Bini & Hume 2016). Video in 2D also reads about 2.2° ' +
  'less than 3D motion capture (Fonda, Sarabon & Li 2014). Compare like with like: static targets for static photos.';

export interface AngleEstimate {
  value: number;
  /** ± one standard deviation where the source gives one. */
  range: [number, number];
  source: string;
}

/** Expected dynamic knee flexion at the bottom of the stroke from a static measurement (+8.2 ± 5°, Bini & Hume 2016 [V]). */
export function staticToDynamicKneeFlexion(staticDeg: number): AngleEstimate {
  requireRange('staticKneeFlexion', staticDeg, 0, 120, '°');
  const { mean, sd } = STATIC_TO_DYNAMIC_KNEE_DEG;
  return {
    value: staticDeg + mean,
    range: [staticDeg + mean - sd, staticDeg + mean + sd],
    source: 'Bini & Hume 2016, Human Movement 17(1):36–42 [V]',
  };
}

/** The static angle that corresponds to a dynamic target (the inverse of staticToDynamicKneeFlexion). */
export function dynamicToStaticKneeFlexion(dynamicDeg: number): AngleEstimate {
  requireRange('dynamicKneeFlexion', dynamicDeg, 0, 130, '°');
  const { mean, sd } = STATIC_TO_DYNAMIC_KNEE_DEG;
  return {
    value: dynamicDeg - mean,
    range: [dynamicDeg - mean - sd, dynamicDeg - mean + sd],
    source: 'Bini & Hume 2016, Human Movement 17(1):36–42 [V]',
  };
}

/**
 * Likely 3D knee angle from a 2D video angle (+2.2°, Fonda, Sarabon & Li 2014 [V]). The input
 * stops 2.2° short of 180° so the result is still an angle between two limb segments [D].
 */
export function video2dTo3dKneeAngle(angle2dDeg: number): number {
  return requireRange('kneeAngle2d', angle2dDeg, 0, 180 - VIDEO_2D_UNDERESTIMATE_DEG, '°') + VIDEO_2D_UNDERESTIMATE_DEG;
}
