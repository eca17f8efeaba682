/** Saddle-height estimates side by side, all brought to the bottom-bracket convention. */
import { ensureFinite, parseInput, requireRange } from '../errors';
import {
  DEFAULT_CRANK_LENGTH_MM,
  DEFAULT_SEAT_TUBE_ANGLE_DEG,
  DISAGREEMENT_FRACTION_OF_INSEAM,
  FERRER_ROCA_FACTORS,
  GATTI_2021,
  HAMLEY_THOMAS_FACTOR,
  INSEAM_MINUS_MM,
  LEMOND_CLIPLESS_REDUCTION_MM,
  LEMOND_FACTOR,
  REFERENCE_STACK_MM,
  STATIC_KNEE_FLEXION_DEG,
} from './constants';
import { saddleHeightForKneeFlexion } from './leg-model';
import {
  saddleHeightInputSchema,
  type SaddleHeightEstimate,
  type SaddleHeightInput,
  type SaddleHeightSummary,
} from './schemas';

/**
 * The one rule that brings every pedal-spindle method to the bottom-bracket convention (our
 * decision, see shared/README.md):
 *   saddle-to-BB = saddle-to-spindle − crank + (stack − REFERENCE_STACK_MM).
 * - Crank: measured with the crank in line with the seat tube, the spindle is one crank length
 *   beyond the BB [D].
 * - Stack: the sources' riders stood on their pedals in ordinary road shoes (REFERENCE_STACK_MM,
 *   [from memory]); a thicker stack leaves the leg less reach, so the saddle goes up by the
 *   difference, as TRADE §2 says for any stack change [D]. With the reference stack, 1.09 × inseam
 *   lands within a few mm of 0.883 × inseam, as Peveler et al. 2005 [V] found the two formulas agree.
 */
export function spindleToBottomBracket(spindleMm: number, crankLengthMm: number, stackMm: number = REFERENCE_STACK_MM): number {
  // Plausibility guards, not advice: 1.104 × the largest inseam we take (1100 mm) is 1214 mm.
  requireRange('spindleLength', spindleMm, 400, 1400, 'mm');
  requireRange('crankLength', crankLengthMm, 100, 220, 'mm');
  requireRange('stack', stackMm, 0, 80, 'mm');
  return spindleMm - crankLengthMm + (stackMm - REFERENCE_STACK_MM);
}

/** Gatti et al. 2021 regression, all in centimetres and degrees: SH = 7.41 + 0.82·I − 0.1·θ + 0.003·I·STA [V]. */
export function gattiSaddleHeightCm(inseamCm: number, kneeFlexionDeg: number, seatTubeAngleDeg: number): number {
  // The same guards as saddleHeightInputSchema (inseam 500–1100 mm, θmin 20–50°, STA 60–90°).
  requireRange('inseamCm', inseamCm, 50, 110, 'cm');
  requireRange('kneeFlexion', kneeFlexionDeg, 20, 50, '°');
  requireRange('seatTubeAngle', seatTubeAngleDeg, 60, 90, '°');
  const g = GATTI_2021;
  return ensureFinite(
    'gatti',
    g.interceptCm + g.inseamCoef * inseamCm + g.kneeCoefPerDeg * kneeFlexionDeg + g.inseamStaCoef * inseamCm * seatTubeAngleDeg,
  );
}

/** The spindle-to-BB conversion in words, for the "how we got this" line. */
function conversionText(crank: number, stack: number): string {
  const d = stack - REFERENCE_STACK_MM;
  if (d === 0) return `minus the ${crank} mm crank`;
  return `minus the ${crank} mm crank, ${d > 0 ? 'plus' : 'minus'} ${Math.abs(d)} mm for a stack ${d > 0 ? 'thicker' : 'thinner'} than the ${REFERENCE_STACK_MM} mm the sources' riders are taken to have`;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 === 1 ? (s[mid] as number) : ((s[mid - 1] as number) + (s[mid] as number)) / 2;
}

const ordered = (a: number, b: number): [number, number] => (a <= b ? [a, b] : [b, a]);

/**
 * All saddle-height estimates for a rider, side by side, each with its method, convention,
 * source, value and range (mm, bottom-bracket centre to saddle top along the seat tube), plus a
 * combined suggested range and a flag when the methods disagree by more than 4 % of inseam
 * (Bini et al. 2011 [V], see DISAGREEMENT_FRACTION_OF_INSEAM).
 *
 * Combined range: median of the lows to median of the highs, so one outlying method cannot
 * drag it. Throws FitInputError on bad input.
 */
export function estimateSaddleHeight(input: SaddleHeightInput): SaddleHeightSummary {
  const p = parseInput(saddleHeightInputSchema, input, 'saddleHeight');
  const assumptions: string[] = [];
  const crank = p.crankLength ?? DEFAULT_CRANK_LENGTH_MM;
  if (p.crankLength === undefined) assumptions.push(`Crank length not given: ${crank} mm assumed.`);
  const stack = p.stack ?? REFERENCE_STACK_MM;
  if (p.stack === undefined) assumptions.push(`Shoe and pedal stack not given: ${stack} mm assumed (road shoes on clipless pedals, from memory).`);
  const toBb = (spindle: number) => spindleToBottomBracket(spindle, crank, stack);
  const conversion = conversionText(crank, stack);
  const sta = p.seatTubeAngle ?? DEFAULT_SEAT_TUBE_ANGLE_DEG;
  if (p.seatTubeAngle === undefined) assumptions.push(`Seat-tube angle not given: ${sta}° assumed (typical road frame, from memory).`);
  const I = p.inseam;
  const estimates: SaddleHeightEstimate[] = [];

  const lemond = LEMOND_FACTOR * I;
  const lemondLow = p.clipless ? lemond - LEMOND_CLIPLESS_REDUCTION_MM : lemond;
  estimates.push({
    method: 'lemond-0883',
    label: '0.883 × inseam',
    convention: 'bb-to-saddle-top',
    conventionValue: lemond,
    conventionRange: [lemondLow, lemond],
    value: lemondLow,
    range: [lemondLow, lemond],
    source: 'LeMond & Gordis 1987, Complete Book of Bicycling [V]; clipless −3 mm [V2]',
    tag: 'V',
    how: `0.883 × ${I} mm = ${lemond.toFixed(1)} mm${p.clipless ? ', minus about 3 mm with clipless pedals' : ''}.`,
  });

  const hamley = HAMLEY_THOMAS_FACTOR * I;
  const hamleyBb = toBb(hamley);
  estimates.push({
    method: 'hamley-thomas-109',
    label: '1.09 × inseam (to the pedal spindle)',
    convention: 'spindle-to-saddle-top',
    conventionValue: hamley,
    conventionRange: [hamley, hamley],
    value: hamleyBb,
    range: [hamleyBb, hamleyBb],
    source: 'Hamley & Thomas 1967, J Physiol 191:55P [V2]',
    tag: 'V2',
    how: `1.09 × ${I} mm = ${hamley.toFixed(1)} mm saddle top to spindle, ${conversion}.`,
  });

  const [fLo, fHi] = FERRER_ROCA_FACTORS;
  const fMid = ((fLo + fHi) / 2) * I;
  estimates.push({
    method: 'ferrer-roca-range',
    label: '108.6–110.4 % of inseam (to the pedal spindle)',
    convention: 'spindle-to-saddle-top',
    conventionValue: fMid,
    conventionRange: [fLo * I, fHi * I],
    value: toBb(fMid),
    range: [toBb(fLo * I), toBb(fHi * I)],
    source: 'Ferrer-Roca et al. 2012, J Strength Cond Res 26(11):3025–3029 [V]',
    tag: 'V',
    how: `${(fLo * 100).toFixed(1)}–${(fHi * 100).toFixed(1)} % of ${I} mm = ${(fLo * I).toFixed(1)}–${(fHi * I).toFixed(1)} mm to the spindle, ${conversion}.`,
  });

  const [mLo, mHi] = INSEAM_MINUS_MM;
  estimates.push({
    method: 'inseam-minus-100',
    label: 'inseam minus 100 mm',
    convention: 'bb-to-saddle-top',
    conventionValue: I - mLo,
    conventionRange: [I - mHi, I - mLo],
    value: I - mLo,
    range: [I - mHi, I - mLo],
    source: 'common practice [CP]',
    tag: 'CP',
    how: `${I} − 100 mm (some use 100–105 mm).`,
  });

  const gattiCm = gattiSaddleHeightCm(I / 10, p.gattiKneeFlexion, sta);
  const gatti = gattiCm * 10;
  const rmse = GATTI_2021.rmseCm * 10;
  estimates.push({
    method: 'gatti-regression',
    label: 'regression on inseam, knee angle and seat-tube angle',
    convention: 'spindle-to-saddle-top',
    conventionValue: gatti,
    conventionRange: [gatti - rmse, gatti + rmse],
    value: toBb(gatti),
    range: [toBb(gatti - rmse), toBb(gatti + rmse)],
    source: 'Gatti et al. 2021, Eur J Sport Sci, doi 10.1080/17461391.2021.1902570 [V]; convention read as saddle-to-spindle [D]',
    tag: 'V',
    how: `7.41 + 0.82·${(I / 10).toFixed(1)} − 0.1·${p.gattiKneeFlexion} + 0.003·${(I / 10).toFixed(1)}·${sta} = ${gattiCm.toFixed(2)} cm (± one RMSE of 1.15 cm), ${conversion}.`,
  });

  if (p.leg) {
    const [tLo, tHi] = p.targetKneeFlexion ? ordered(...p.targetKneeFlexion) : STATIC_KNEE_FLEXION_DEG;
    const model = { ...p.leg, seatTubeAngle: sta, crankLength: crank, stack };
    const mid = (tLo + tHi) / 2;
    const value = saddleHeightForKneeFlexion(model, mid);
    // More flexion means a lower saddle, so the high flexion bound gives the low height.
    const range: [number, number] = [saddleHeightForKneeFlexion(model, tHi), saddleHeightForKneeFlexion(model, tLo)];
    estimates.push({
      method: 'knee-angle-model',
      label: `knee flexion ${tLo}–${tHi}° at the bottom of the stroke (leg model)`,
      convention: 'bb-to-saddle-top',
      conventionValue: value,
      conventionRange: range,
      value,
      range,
      source: 'target static knee flexion 25–30°: Bini, Hume & Croft 2011, Sports Med 41(6):463–476 [V2]; 2D leg model [D]',
      tag: 'D',
      how: `A side-view model of this leg (thigh ${p.leg.thigh} mm, shank ${p.leg.shank} mm) on this bike, solved for the saddle height that gives ${tLo}–${tHi}° of knee flexion with the crank at 6 o'clock.`,
    });
  }

  const values = estimates.map((e) => e.value);
  const lows = estimates.map((e) => e.range[0]);
  const highs = estimates.map((e) => e.range[1]);
  const suggestedRange = ordered(median(lows), median(highs));
  const suggested = Math.min(suggestedRange[1], Math.max(suggestedRange[0], median(values)));
  const spread = Math.max(...values) - Math.min(...values);
  const threshold = DISAGREEMENT_FRACTION_OF_INSEAM * I;
  for (const e of estimates) ensureFinite(`estimates.${e.method}`, e.value);
  return {
    estimates,
    suggested: ensureFinite('suggested', suggested),
    suggestedRange,
    spread,
    disagreementThreshold: threshold,
    disagree: spread > threshold,
    assumptions,
  };
}
