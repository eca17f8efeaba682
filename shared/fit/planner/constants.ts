/**
 * Planner defaults and hard safety bounds. Tags as in TRADE.md: [V] verified, [V2] quoted,
 * [D] derived, [CP] common practice, [M] / [from memory] unverified. Values marked "our decision"
 * are project rules, not facts of the trade: they are ours to change and no source stands behind them.
 */
import type { ParameterGroup, SetupParameter } from '../setup/parameters';

export type Caps = Record<SetupParameter, number>;

/**
 * Default largest change per step (mm or degrees). TRADE §4 [M/CP]: saddle height 2–5 mm;
 * setback ~5 mm; cleat 1–2 mm or 1–2°; bars one 5 mm spacer or one 10 mm stem step; crank one
 * 2.5 mm size. Reach and drop follow the stem and spacer steps they come from [D]. Saddle tilt
 * and stack have no TRADE figure: 1° and 2 mm are [from memory].
 */
export const DEFAULT_STEP_CAPS: Caps = {
  saddleHeight: 3,
  saddleSetback: 5,
  saddleTilt: 1,
  reach: 10,
  drop: 5,
  stemLength: 10,
  spacerStack: 5,
  crankLength: 2.5,
  stack: 2,
  cleatForeAft: 2,
  cleatRotation: 2,
};

/**
 * Hard safety bounds on per-step caps; clinic policy may move a cap only inside [min, max].
 * Every minimum is our decision: small enough to keep a careful plan able to move at all (crank's
 * is one 2.5 mm size [V], since cranks come in no smaller steps). Each maximum says where it comes from.
 */
export const HARD_STEP_CAP_BOUNDS: Record<SetupParameter, readonly [number, number]> = {
  saddleHeight: [1, 5], // max: top of TRADE §4's 2–5 mm [M/CP]
  saddleSetback: [1, 5], // max: TRADE §4's ~5 mm [M/CP]
  saddleTilt: [0.5, 2], // max: our safety decision; TRADE has no tilt step (2° [from memory] as a large single move)
  reach: [2, 10], // max: one 10 mm stem step, TRADE §4 [M/CP]; reach follows the stem [D]
  drop: [1, 10], // max: our safety decision, two 5 mm spacers' worth; TRADE §4 gives one 5 mm spacer
  stemLength: [5, 10], // max: one 10 mm stem step, TRADE §4 [M/CP]
  spacerStack: [1, 5], // max: one 5 mm spacer, TRADE §4 [M/CP]
  crankLength: [2.5, 5], // max: our safety decision, two sizes; TRADE §4 gives one 2.5 mm size [M/CP]
  stack: [0.5, 3], // max: our safety decision; TRADE has no stack step (3 mm [from memory], a thick shim)
  cleatForeAft: [0.5, 2], // max: top of TRADE §4's 1–2 mm [M/CP]
  cleatRotation: [0.5, 2], // max: top of TRADE §4's 1–2° [M/CP]
};

/**
 * Default cumulative cap per window: no more than this total movement (sum of step sizes, up or
 * down) in any `windowDays`. Two default steps' worth per 28 days, which a 14-day adaptation allows
 * anyway, so the window bites only when a clinic shortens adaptation or reverses direction.
 * Our decision (a project safety rule, not a trade figure).
 */
export const DEFAULT_WINDOW_CAPS: Caps = {
  saddleHeight: 6,
  saddleSetback: 10,
  saddleTilt: 2,
  reach: 20,
  drop: 10,
  stemLength: 20,
  spacerStack: 10,
  crankLength: 5,
  stack: 4,
  cleatForeAft: 4,
  cleatRotation: 4,
};

/** Hard bounds on window caps: at least one minimum step, at most two maximum steps. Our decision. */
export const HARD_WINDOW_CAP_BOUNDS: Record<SetupParameter, readonly [number, number]> = Object.fromEntries(
  Object.entries(HARD_STEP_CAP_BOUNDS).map(([k, [lo, hi]]) => [k, [lo, 2 * hi] as const]),
) as Record<SetupParameter, readonly [number, number]>;

/** The cumulative-cap window, days: 28 by default, 14–56 allowed. Our decision (two default adaptation periods). */
export const DEFAULT_WINDOW_DAYS = 28;
export const HARD_WINDOW_DAYS_BOUNDS = [14, 56] as const;

/**
 * Adaptation before the next step: one to two weeks (TRADE §4 [M/CP]); ride several times first
 * (Asplund & St Pierre 2004 [V]). Default 14 days (the top of TRADE's range) and 4 rides (our
 * reading of "several"); the bounds 7–42 days and 3–20 rides are our decision.
 */
export const DEFAULT_ADAPTATION_DAYS = 14;
export const HARD_ADAPTATION_DAYS_BOUNDS = [7, 42] as const;
export const DEFAULT_ADAPTATION_RIDES = 4;
export const HARD_ADAPTATION_RIDES_BOUNDS = [3, 20] as const;

/**
 * A revert to an earlier setup moves in one step only if the rider left that setup no more than
 * this many days ago (90 by default, 0–180 allowed). Our decision: no trade source.
 */
export const DEFAULT_REVERT_RECENCY_DAYS = 90;
export const HARD_REVERT_RECENCY_BOUNDS = [0, 180] as const;

/**
 * Pain bands on the 0–10 scale: 4–6 moderate, 7–10 severe ([from memory], the usual NRS bands).
 * Severe pain (SEVERE_PAIN in triage, TRADE §6: pain ≥ 7/10 → physio referral [V]) stops the plan;
 * moderate pain halves every cap (our decision).
 */
export const MODERATE_PAIN = 4;
export const MODERATE_PAIN_CAP_FACTOR = 0.5;

/** At most one parameter group changes per step: "change one thing at a time" (Asplund & St Pierre 2004 [V]). Not a policy setting. */
export const GROUPS_PER_STEP = 1;

/** A plan longer than this many steps (well over a year at default spacing) is cut and needs a rethink. Our decision. */
export const MAX_STEPS = 30;

/**
 * Default order in which groups are worked through: from the feet up (cleats, cranks, saddle
 * height, fore-aft, tilt), then the front end. Our decision (the contact points nearest the
 * pedal first, as they change the leg's reach that the saddle then follows).
 */
export const DEFAULT_GROUP_ORDER: readonly ParameterGroup[] = ['cleats', 'cranks', 'saddleHeight', 'saddleForeAft', 'saddleTilt', 'bars'];

/** Setups that agree to within this (mm or degrees) are the same setup (storage rounds to 0.1). */
export const SAME_SETUP_TOLERANCE = 0.05;

/** Floating-point slack for cap comparisons. */
export const EPS = 1e-6;
