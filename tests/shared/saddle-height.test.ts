import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import fc from 'fast-check';
import { FitInputError } from '@shared/fit/errors';
import {
  cleatMoveCorrection,
  estimateSaddleHeight,
  kneeFlexionAt,
  railSlideToKeepSetback,
  saddleHeightForKneeFlexion,
  seatPostMove,
  seatPostMoveForVertical,
  spindleToBottomBracket,
  stackChangeCorrection,
  type LegModel,
} from '@shared/fit/saddle-height';

/** A vertical seat tube, no foot, crank at 6 o'clock: the hip-ankle distance is saddle height + crank. */
const straightDown = (thigh: number, shank: number): LegModel => ({
  seatTubeAngle: 90, crankLength: 170, stack: 0, thigh, shank, footLength: 0,
});

describe('the knee-angle leg model', () => {
  it('gives 90° of knee flexion on a 3-4-5 triangle (thigh 300, shank 400, hip-ankle 500 mm) [D]', () => {
    const model = straightDown(300, 400);
    expect(kneeFlexionAt(model, 330).kneeFlexion).toBeCloseTo(90, 9);
    expect(saddleHeightForKneeFlexion(model, 90)).toBeCloseTo(330, 5);
  });

  it('gives 60° of flexion when the interior angle is 120° (thigh = shank = 400, hip-ankle 400√3) [D]', () => {
    const model = straightDown(400, 400);
    const sh = 400 * Math.sqrt(3) - 170;
    expect(kneeFlexionAt(model, sh).kneeFlexion).toBeCloseTo(60, 9);
    expect(saddleHeightForKneeFlexion(model, 60)).toBeCloseTo(sh, 5);
  });

  it('puts the knee in front of the hip-ankle line, at thigh length from the hip', () => {
    const pose = kneeFlexionAt({ seatTubeAngle: 73, crankLength: 172.5, stack: 20, thigh: 420, shank: 420, footLength: 140, footAngle: 30 }, 740);
    expect(Math.hypot(pose.knee.x - pose.hip.x, pose.knee.y - pose.hip.y)).toBeCloseTo(420, 6);
    expect(Math.hypot(pose.knee.x - pose.ankle.x, pose.knee.y - pose.ankle.y)).toBeCloseTo(420, 6);
    expect(pose.knee.x).toBeGreaterThan((pose.hip.x + pose.ankle.x) / 2);
  });

  it('agrees with mathjs on the knee angle for a realistic rider', () => {
    const model: LegModel = { seatTubeAngle: 73, crankLength: 172.5, stack: 22, thigh: 430, shank: 430, footLength: 150, footAngle: 35, hipAbove: 20 };
    const sh = 745;
    const sta = math.unit(73, 'deg');
    const hip = [-sh * math.cos(sta), sh * math.sin(sta) + 20];
    const ankle = [-150 * math.cos(math.unit(35, 'deg')), -172.5 + 22 + 150 * math.sin(math.unit(35, 'deg'))];
    const d = math.norm(math.subtract(hip, ankle) as number[]) as number;
    const interior = math.acos((430 ** 2 + 430 ** 2 - d ** 2) / (2 * 430 * 430)) as number;
    expect(kneeFlexionAt(model, sh).kneeFlexion).toBeCloseTo(180 - (interior * 180) / Math.PI, 9);
  });

  it('inverts itself: the height found gives back the target angle, for any plausible leg', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 380, max: 480, noNaN: true }),
        fc.double({ min: 380, max: 480, noNaN: true }),
        fc.double({ min: 68, max: 78, noNaN: true }),
        fc.double({ min: 15, max: 50, noNaN: true }),
        (thigh, shank, sta, target) => {
          const model: LegModel = { seatTubeAngle: sta, crankLength: 172.5, stack: 20, thigh, shank, footLength: 140, footAngle: 30 };
          const sh = saddleHeightForKneeFlexion(model, target);
          expect(kneeFlexionAt(model, sh).kneeFlexion).toBeCloseTo(target, 5);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('refuses a saddle the leg cannot reach, a target no height can give, and a bad target', () => {
    const model = straightDown(300, 400);
    expect(() => kneeFlexionAt(model, 1000)).toThrow(FitInputError);
    expect(() => kneeFlexionAt({ ...model, hipAbove: -100 }, 300)).not.toThrow();
    expect(() => kneeFlexionAt({ ...straightDown(400, 300), footLength: 0 }, 300)).not.toThrow();
    expect(() => saddleHeightForKneeFlexion(straightDown(700, 700), 10)).toThrow(/No saddle height/);
    expect(() => saddleHeightForKneeFlexion(model, Number.NaN)).toThrow(FitInputError);
    expect(() => saddleHeightForKneeFlexion(model, 0)).toThrow(/targetKneeFlexion/);
    expect(() => kneeFlexionAt({ ...model, thigh: -5 }, 500)).toThrow(FitInputError);
  });

  it('refuses a knee folded past its limit', () => {
    // thigh 700 and shank 200 need at least 500 mm hip-ankle; a 300 mm saddle gives 470.
    expect(() => kneeFlexionAt(straightDown(700, 200), 300)).toThrow(/bend past its limit/);
  });
});

describe('estimateSaddleHeight', () => {
  const input = { inseam: 850, crankLength: 172.5, stack: 20, seatTubeAngle: 73 };

  it('returns every method side by side with convention, source, value and range, in the BB convention', () => {
    const r = estimateSaddleHeight(input);
    expect(r.estimates.map((e) => e.method)).toEqual(['lemond-0883', 'hamley-thomas-109', 'ferrer-roca-range', 'inseam-minus-100', 'gatti-regression']);
    for (const e of r.estimates) {
      expect(e.source.length).toBeGreaterThan(5);
      expect(e.range[0]).toBeLessThanOrEqual(e.value + 1e-9);
      expect(e.range[1]).toBeGreaterThanOrEqual(e.value - 1e-9);
      expect(Number.isFinite(e.value)).toBe(true);
    }
    expect(r.assumptions).toEqual([]);
  });

  it('converts the spindle convention by subtracting the crank length: 1.09 × 850 = 926.5 mm (Hamley & Thomas 1967 [V2]; TRADE check value [D])', () => {
    const r = estimateSaddleHeight(input);
    const hamley = r.estimates.find((e) => e.method === 'hamley-thomas-109');
    // With the reference 20 mm stack [from memory] only the crank comes off (TRADE §2 [D]).
    expect(hamley?.value).toBeCloseTo(926.5 - 172.5, 9);
    expect(hamley?.range).toEqual([hamley?.value, hamley?.value]);
    expect(spindleToBottomBracket(900, 170)).toBe(730);
  });

  it('applies one conversion, crank and stack, to every spindle method (worked example, our rule on TRADE §2 [D])', () => {
    // Inseam 850, cranks 170, stack 26 mm: saddle-to-BB = spindle value − 170 + (26 − 20).
    const r = estimateSaddleHeight({ inseam: 850, crankLength: 170, stack: 26, seatTubeAngle: 73, gattiKneeFlexion: 35 });
    const by = (m: string) => r.estimates.find((e) => e.method === m);
    expect(by('hamley-thomas-109')?.value).toBeCloseTo(926.5 - 170 + 6, 9); // 762.5
    expect(by('ferrer-roca-range')?.range[0]).toBeCloseTo(0.01 * 108.6 * 850 - 170 + 6, 9); // 759.1
    expect(by('ferrer-roca-range')?.range[1]).toBeCloseTo(0.01 * 110.4 * 850 - 170 + 6, 9); // 774.4
    expect(by('gatti-regression')?.value).toBeCloseTo(922.25 - 170 + 6, 9); // 758.25
    expect(by('hamley-thomas-109')?.how).toMatch(/plus 6 mm for a stack thicker than the 20 mm/);
    // The BB-convention methods do not move with the stack.
    expect(by('lemond-0883')?.value).toBeCloseTo(750.55 - 3, 9);
    expect(spindleToBottomBracket(926.5, 170, 14)).toBeCloseTo(750.5, 9);
    expect(estimateSaddleHeight({ ...input, stack: 14 }).estimates[1]?.how).toMatch(/minus 6 mm for a stack thinner/);
  });

  it('lowers the 0.883 value 3 mm with clipless pedals (LeMond 1987 [V2]) and not without', () => {
    const clip = estimateSaddleHeight(input).estimates[0];
    const flat = estimateSaddleHeight({ ...input, clipless: false }).estimates[0];
    expect(clip?.value).toBeCloseTo(750.55 - 3, 9);
    expect(flat?.value).toBeCloseTo(750.55, 9);
  });

  it('combines the methods into a median range and flags disagreement over 4 % of inseam (Bini 2011 [V])', () => {
    const r = estimateSaddleHeight(input);
    expect(r.disagreementThreshold).toBeCloseTo(34, 9);
    expect(r.suggestedRange[0]).toBeLessThanOrEqual(r.suggested);
    expect(r.suggested).toBeLessThanOrEqual(r.suggestedRange[1]);
    expect(r.disagree).toBe(r.spread > 34);
    expect(r.disagree).toBe(false);
  });

  it('adds the knee-angle method when leg segments are given, and flags a leg that disagrees', () => {
    const r = estimateSaddleHeight({ ...input, leg: { thigh: 470, shank: 470, footLength: 140, footAngle: 30 } });
    const knee = r.estimates.find((e) => e.method === 'knee-angle-model');
    expect(knee).toBeDefined();
    expect(knee?.range[0]).toBeLessThan(knee?.range[1] ?? 0);
    expect(r.disagree).toBe(true);
    const custom = estimateSaddleHeight({ ...input, leg: { thigh: 420, shank: 420, footLength: 140, footAngle: 30 }, targetKneeFlexion: [35, 25] });
    expect(custom.estimates.at(-1)?.label).toContain('25–35°');
  });

  it('lists the defaults it assumed', () => {
    const r = estimateSaddleHeight({ inseam: 850 });
    expect(r.assumptions).toHaveLength(3);
    expect(r.assumptions.join(' ')).toMatch(/172.5 mm.*0 mm.*73°/s);
  });

  it('refuses NaN, negative and absurd inseams with a typed error naming the field', () => {
    for (const inseam of [Number.NaN, -850, 20, 5000, Infinity]) {
      try {
        estimateSaddleHeight({ inseam });
        expect.unreachable();
      } catch (e) {
        expect(e).toBeInstanceOf(FitInputError);
        expect((e as FitInputError).field).toBe('inseam');
      }
    }
  });
});

describe('saddle-height corrections', () => {
  it('matches a cleat move of up to 4 mm one-for-one, then by half but never less than 4 mm [V2/D]', () => {
    expect(cleatMoveCorrection(-3)).toBe(-3);
    expect(cleatMoveCorrection(-4)).toBe(-4);
    expect(cleatMoveCorrection(-6)).toBe(-4);
    expect(cleatMoveCorrection(-12)).toBe(-6);
    expect(cleatMoveCorrection(3)).toBe(3);
    expect(cleatMoveCorrection(0)).toBe(0);
  });

  it('raises the saddle by a thicker stack: +3 mm for 18 → 21 mm (TRADE §2 [D])', () => {
    expect(stackChangeCorrection(18, 21)).toBe(3);
  });

  it('couples a seat-post move to setback through the seat-tube angle (3-4-5 and 30-60-90 cases) [D]', () => {
    // A post at asin(4/5) ≈ 53.13° is outside the frame range, so use 90° and 60°.
    expect(seatPostMove(10, 90).setback).toBeCloseTo(0, 9);
    expect(seatPostMove(10, 60).setback).toBeCloseTo(5, 9); // cos 60° = 1/2
    expect(seatPostMove(10, 60).vertical).toBeCloseTo(5 * Math.sqrt(3), 9);
    expect(seatPostMoveForVertical(5 * Math.sqrt(3), 60).alongSeatTube).toBeCloseTo(10, 9);
    expect(railSlideToKeepSetback(10, 73)).toBeCloseTo(10 * (math.cos(math.unit(73, 'deg')) as number), 9);
  });

  it('refuses absurd inputs', () => {
    expect(() => seatPostMove(10, 20)).toThrow(FitInputError);
    expect(() => stackChangeCorrection(-1, 3)).toThrow(FitInputError);
    expect(() => cleatMoveCorrection(Number.NaN)).toThrow(FitInputError);
  });
});
