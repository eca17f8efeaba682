/**
 * Saddle-height facts. Every value names its source and TRADE.md tag:
 * [V] seen in published material, [V2] seen only as quoted, [D] derived here,
 * [CP] common practice, [M] / [from memory] unverified.
 */

/** Saddle height = 0.883 × inseam, bottom-bracket centre to saddle top. LeMond & Gordis 1987 [V]. */
export const LEMOND_FACTOR = 0.883;

/** Subtract about 3 mm from the 0.883 result with clipless pedals. LeMond & Gordis 1987, as quoted [V2]. */
export const LEMOND_CLIPLESS_REDUCTION_MM = 3;

/**
 * Saddle top to pedal spindle at the bottom of the stroke = 1.09 × inseam.
 * Hamley & Thomas 1967, J Physiol 191:55P [V2]. Pedal-spindle convention, not bottom bracket.
 */
export const HAMLEY_THOMAS_FACTOR = 1.09;

/**
 * 108.6–110.4 % of inseam, saddle top to pedal spindle, proposed to give 30–40° dynamic knee
 * flexion. Ferrer-Roca et al. 2012, J Strength Cond Res 26(11):3025–3029 [V].
 */
export const FERRER_ROCA_FACTORS = [1.086, 1.104] as const;

/** Inseam minus 100 mm (some use 100–105 mm), bottom-bracket convention. Common practice [CP]. */
export const INSEAM_MINUS_MM = [100, 105] as const;

/**
 * Regression SH(cm) = 7.41 + 0.82·I − 0.1·θmin + 0.003·I·STA, R² 0.97, RMSE 1.15 cm.
 * Gatti et al. 2021, Eur J Sport Sci, doi 10.1080/17461391.2021.1902570 [V].
 * The paper's SH convention was not checked in TRADE.md; its magnitude (≈ 92 cm at I = 85 cm)
 * matches the pedal-spindle convention (1.09 × 85 = 92.7 cm), not the bottom-bracket one
 * (0.883 × 85 = 75.1 cm), so it is read as saddle top to spindle [D].
 */
export const GATTI_2021 = {
  interceptCm: 7.41,
  inseamCoef: 0.82,
  kneeCoefPerDeg: -0.1,
  inseamStaCoef: 0.003,
  rmseCm: 1.15,
} as const;

/** Static (goniometer) knee flexion at the bottom of the stroke: 25–30°. Bini, Hume & Croft 2011, Sports Med 41(6):463–476 [V2]. */
export const STATIC_KNEE_FLEXION_DEG = [25, 30] as const;

/** 25–35° static is also widely used. Common practice [CP]. */
export const STATIC_KNEE_FLEXION_WIDE_DEG = [25, 35] as const;

/** Dynamic (2D video) knee flexion at the bottom of the stroke: 30–40°. Ferrer-Roca et al. 2012 [V]. */
export const DYNAMIC_KNEE_FLEXION_DEG = [30, 40] as const;

/**
 * Saddle-height differences under 4 % of trochanteric length appeared not to matter.
 * Bini et al. 2011 [V]. Used as the "methods disagree" threshold with inseam in place of
 * trochanteric length [D]: inseam is the shorter of the two, so the threshold is slightly
 * stricter than the paper's.
 */
export const DISAGREEMENT_FRACTION_OF_INSEAM = 0.04;

/**
 * Cleat moved back 2–4 mm → lower the saddle the same; more than that → by half.
 * TRADE §4, as quoted [V2]. Moves up to this size are matched one-for-one.
 */
export const CLEAT_SMALL_MOVE_MM = 4;

/** Crank length, BB centre to pedal-axle centre; common sizes [V]. */
export const COMMON_CRANK_LENGTHS_MM = [165, 167.5, 170, 172.5, 175] as const;

/** One crank size step, from the common sizes above [V]. */
export const CRANK_SIZE_STEP_MM = 2.5;

/** Seat-tube angle assumed when none is given: a typical road frame. [from memory] */
export const DEFAULT_SEAT_TUBE_ANGLE_DEG = 73;

/** Crank length assumed when none is given: a common size from the list above [V]. */
export const DEFAULT_CRANK_LENGTH_MM = 172.5;

/**
 * Shoe, cleat and pedal stack (pedal-axle centre to the sole of the foot) of a rider in road shoes
 * on clipless pedals: about 20 mm [from memory]. None of the pedal-spindle sources (Hamley &
 * Thomas 1967, Ferrer-Roca 2012, Gatti 2021) reports its riders' stack, so this is the stack their
 * numbers are taken to include; it is also the stack assumed when the rider gives none.
 */
export const REFERENCE_STACK_MM = 20;
