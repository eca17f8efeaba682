/**
 * Body regions for the front/back body map. Ids are stable (stored with symptoms); `view` says
 * on which drawing the region is clickable, `side` is the rider's own left/right.
 */

export const BODY_REGIONS = [
  'neck',
  'shoulder-left', 'shoulder-right',
  'upper-back',
  'lower-back',
  'hand-left', 'hand-right',
  'hip-left', 'hip-right',
  'sit-bone-left', 'sit-bone-right',
  'perineum',
  'thigh-front-left', 'thigh-front-right',
  'thigh-back-left', 'thigh-back-right',
  'knee-front-left', 'knee-front-right',
  'knee-back-left', 'knee-back-right',
  'knee-inner-left', 'knee-inner-right',
  'knee-outer-left', 'knee-outer-right',
  'calf-left', 'calf-right',
  'achilles-left', 'achilles-right',
  'foot-left', 'foot-right',
] as const;
export type BodyRegion = (typeof BODY_REGIONS)[number];

export interface RegionInfo {
  label: string;
  view: 'front' | 'back' | 'both';
  side: 'left' | 'right' | 'centre';
}

function sided(base: string, view: RegionInfo['view']): [RegionInfo, RegionInfo] {
  return [
    { label: `${base}, left`, view, side: 'left' },
    { label: `${base}, right`, view, side: 'right' },
  ];
}

const [shoulderL, shoulderR] = sided('Shoulder', 'both');
const [handL, handR] = sided('Hand and wrist', 'front');
const [hipL, hipR] = sided('Hip', 'front');
const [sitL, sitR] = sided('Sit bone / buttock', 'back');
const [thighFL, thighFR] = sided('Front of thigh', 'front');
const [thighBL, thighBR] = sided('Back of thigh', 'back');
const [kneeFL, kneeFR] = sided('Front of knee', 'front');
const [kneeBL, kneeBR] = sided('Back of knee', 'back');
const [kneeIL, kneeIR] = sided('Inner knee', 'front');
const [kneeOL, kneeOR] = sided('Outer knee', 'front');
const [calfL, calfR] = sided('Calf', 'back');
const [achL, achR] = sided('Achilles tendon', 'back');
const [footL, footR] = sided('Foot', 'front');

/** Labels and placement for each body-map region. */
export const REGION_INFO: Record<BodyRegion, RegionInfo> = {
  neck: { label: 'Neck', view: 'back', side: 'centre' },
  'shoulder-left': shoulderL, 'shoulder-right': shoulderR,
  'upper-back': { label: 'Upper back', view: 'back', side: 'centre' },
  'lower-back': { label: 'Lower back', view: 'back', side: 'centre' },
  'hand-left': handL, 'hand-right': handR,
  'hip-left': hipL, 'hip-right': hipR,
  'sit-bone-left': sitL, 'sit-bone-right': sitR,
  perineum: { label: 'Saddle area (perineum)', view: 'front', side: 'centre' },
  'thigh-front-left': thighFL, 'thigh-front-right': thighFR,
  'thigh-back-left': thighBL, 'thigh-back-right': thighBR,
  'knee-front-left': kneeFL, 'knee-front-right': kneeFR,
  'knee-back-left': kneeBL, 'knee-back-right': kneeBR,
  'knee-inner-left': kneeIL, 'knee-inner-right': kneeIR,
  'knee-outer-left': kneeOL, 'knee-outer-right': kneeOR,
  'calf-left': calfL, 'calf-right': calfR,
  'achilles-left': achL, 'achilles-right': achR,
  'foot-left': footL, 'foot-right': footR,
};

/** True for the knee regions (the Ottawa knee rules apply only to these). */
export function isKneeRegion(region: BodyRegion): boolean {
  return region.startsWith('knee-');
}
