/**
 * The setup parameters the planner moves, their units, plausibility limits and groups.
 * Conventions follow PRODUCT.md "Measurements": millimetres and degrees throughout.
 */

export const SETUP_PARAMETERS = [
  'saddleHeight',
  'saddleSetback',
  'saddleTilt',
  'reach',
  'drop',
  'stemLength',
  'spacerStack',
  'crankLength',
  'stack',
  'cleatForeAft',
  'cleatRotation',
] as const;
export type SetupParameter = (typeof SETUP_PARAMETERS)[number];

export interface ParameterInfo {
  unit: 'mm' | 'deg';
  /** Plain label for screens. */
  label: string;
  /** How it is measured, in words a rider can follow. */
  measure: string;
  /**
   * Plausibility limits. Values outside are refused as typing or unit mistakes; they are
   * not fit advice. Chosen wide enough for children's bikes and time-trial positions.
   */
  min: number;
  max: number;
}

/** What each parameter means and how it is measured. */
export const PARAMETER_INFO: Record<SetupParameter, ParameterInfo> = {
  saddleHeight: {
    unit: 'mm', label: 'saddle height', min: 300, max: 1100,
    measure: 'measure from the centre of the bottom bracket to the top of the saddle along the seat tube',
  },
  saddleSetback: {
    unit: 'mm', label: 'saddle setback', min: -150, max: 250,
    measure: 'hang a plumb line from the saddle nose and measure horizontally to the centre of the bottom bracket (positive when the nose is behind it)',
  },
  saddleTilt: {
    unit: 'deg', label: 'saddle tilt', min: -20, max: 20,
    measure: 'lay a level (or a phone level app) along the saddle from nose to tail; nose up is positive',
  },
  reach: {
    unit: 'mm', label: 'saddle-to-bar reach', min: 250, max: 900,
    measure: 'measure from the saddle nose to the centre of the handlebar top',
  },
  drop: {
    unit: 'mm', label: 'saddle-to-bar drop', min: -250, max: 350,
    measure: 'with a level from the saddle top, measure down to the top of the handlebar (positive when the bar is lower)',
  },
  stemLength: {
    unit: 'mm', label: 'stem length', min: 20, max: 200,
    measure: 'read the length printed on the stem, or measure centre of steerer clamp to centre of bar clamp',
  },
  spacerStack: {
    unit: 'mm', label: 'spacer stack', min: 0, max: 120,
    measure: 'add up the spacers under the stem on the steerer tube',
  },
  crankLength: {
    unit: 'mm', label: 'crank length', min: 100, max: 220,
    measure: 'read the length stamped inside the crank arm (bottom-bracket centre to pedal-axle centre)',
  },
  stack: {
    unit: 'mm', label: 'shoe and pedal stack', min: 0, max: 80,
    measure: 'measure from the pedal-axle centre to the sole of the foot inside the shoe (pedal, cleat and sole together)',
  },
  cleatForeAft: {
    unit: 'mm', label: 'cleat fore-aft', min: -40, max: 40,
    measure: 'measure the cleat position against the marks on the shoe sole; toward the toe is positive',
  },
  cleatRotation: {
    unit: 'deg', label: 'cleat rotation', min: -20, max: 20,
    measure: 'read the angle against the marks on the shoe sole; positive turns the toes outward',
  },
};

export const PARAMETER_GROUPS = ['saddleHeight', 'saddleForeAft', 'saddleTilt', 'bars', 'cranks', 'cleats'] as const;
export type ParameterGroup = (typeof PARAMETER_GROUPS)[number];

/**
 * Which parameters move together as one "thing" in the sense of Asplund & St Pierre 2004
 * ("change one thing at a time"). The bar group holds the four numbers a front-end change
 * touches; the cleat group holds everything done at the shoe and pedal.
 */
export const GROUP_PARAMETERS: Record<ParameterGroup, readonly SetupParameter[]> = {
  saddleHeight: ['saddleHeight'],
  saddleForeAft: ['saddleSetback'],
  saddleTilt: ['saddleTilt'],
  bars: ['reach', 'drop', 'stemLength', 'spacerStack'],
  cranks: ['crankLength'],
  cleats: ['cleatForeAft', 'cleatRotation', 'stack'],
};

/** Plain group labels for screens. */
export const GROUP_LABELS: Record<ParameterGroup, string> = {
  saddleHeight: 'saddle height',
  saddleForeAft: 'saddle fore-aft',
  saddleTilt: 'saddle tilt',
  bars: 'handlebar position',
  cranks: 'crank length',
  cleats: 'shoes, pedals and cleats',
};

/**
 * Groups whose change carries a saddle-height compensation in the same step (TRADE §2, §4):
 * a crank change (shorter by Δ → saddle up Δ), a stack change (thicker by Δ → saddle up Δ) and a
 * cleat fore-aft move (back 2–4 mm → saddle down the same; more → by half). Cleat rotation
 * does not change leg length and couples with nothing.
 */
export const COUPLED_GROUPS: readonly ParameterGroup[] = ['cranks', 'cleats'];

/** The group a parameter belongs to. */
export function groupOf(parameter: SetupParameter): ParameterGroup {
  for (const group of PARAMETER_GROUPS) {
    if (GROUP_PARAMETERS[group].includes(parameter)) return group;
  }
  /* v8 ignore next -- every parameter is in a group; the table above is exhaustive */
  throw new Error(`no group for ${parameter}`);
}
