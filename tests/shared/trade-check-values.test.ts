/**
 * Every check value in TRADE.md's last table, each with its source and tag:
 * [V] verified, [V2] quoted, [D] derived, [CP] common practice, [M] from memory.
 */
import { describe, expect, it } from 'vitest';
import { compareScores } from '@shared/fit/checkin';
import { parseTyreSize, staticToDynamicKneeFlexion, video2dTo3dKneeAngle } from '@shared/fit/photo';
import {
  cleatMoveCorrection,
  crankChangeCorrection,
  estimateSaddleHeight,
  gattiSaddleHeightCm,
  seatPostMove,
} from '@shared/fit/saddle-height';

const byMethod = (inseam: number, method: string) => {
  const e = estimateSaddleHeight({ inseam, crankLength: 170 }).estimates.find((x) => x.method === method);
  if (!e) throw new Error(`no ${method}`);
  return e;
};

describe('TRADE.md check values', () => {
  it('inseam 860 mm × 0.883 gives 759.38 mm (LeMond & Gordis 1987 [V])', () => {
    expect(byMethod(860, 'lemond-0883').conventionValue).toBeCloseTo(759.38, 2);
  });

  it('inseam 850 mm gives 750.55 mm by 0.883 (LeMond 1987) and 926.5 mm saddle-to-spindle by 1.09 (Hamley & Thomas 1967) [D]', () => {
    expect(byMethod(850, 'lemond-0883').conventionValue).toBeCloseTo(750.55, 2);
    const hamley = byMethod(850, 'hamley-thomas-109');
    expect(hamley.convention).toBe('spindle-to-saddle-top');
    expect(hamley.conventionValue).toBeCloseTo(926.5, 2);
  });

  it('inseam 850 mm at 108.6–110.4 % gives 923.1–938.4 mm saddle-to-spindle (Ferrer-Roca 2012 [D])', () => {
    const [lo, hi] = byMethod(850, 'ferrer-roca-range').conventionRange;
    expect(lo).toBeCloseTo(923.1, 1);
    expect(hi).toBeCloseTo(938.4, 1);
  });

  it('Gatti equation with I = 85 cm, θ = 35°, STA = 73° gives 92.225 cm (Gatti 2021 [D])', () => {
    expect(gattiSaddleHeightCm(85, 35, 73)).toBeCloseTo(92.225, 6);
    const gatti = estimateSaddleHeight({ inseam: 850, seatTubeAngle: 73, gattiKneeFlexion: 35, crankLength: 170 }).estimates.find(
      (e) => e.method === 'gatti-regression',
    );
    expect(gatti?.conventionValue).toBeCloseTo(922.25, 6);
  });

  it('a 2D video knee angle of 30.0° is about 32.2° in 3D (Fonda 2014 [V])', () => {
    expect(video2dTo3dKneeAngle(30)).toBeCloseTo(32.2, 6);
  });

  it('cranks 172.5 → 165 mm raise the saddle 7.5 mm (geometry [D])', () => {
    expect(crankChangeCorrection(172.5, 165)).toBeCloseTo(7.5, 9);
  });

  it('a cleat moved back 10 mm lowers the saddle 5 mm ([V2])', () => {
    expect(cleatMoveCorrection(-10)).toBeCloseTo(-5, 9);
  });

  // A consistency check, not a verification: the 672 mm end follows from section ≈ width (TRADE §7
  // [V2]), but the 677 mm end is what SECTION_HEIGHT_FACTOR_RANGE's 1.1 was fitted to [D, fitted].
  it('tyre 25-622 has an outside diameter of about 672–677 mm (ISO 5775 [V2]; upper end fitted [D])', () => {
    const t = parseTyreSize('25-622');
    expect(t.outsideDiameter).toBeGreaterThanOrEqual(672);
    expect(t.outsideDiameter).toBeLessThanOrEqual(677);
    expect(t.outsideDiameterRange[0]).toBeCloseTo(672, 6);
    expect(t.outsideDiameterRange[1]).toBeCloseTo(677, 6);
  });

  it('NRS 6 → 4 is much better: −2 points, −33 % (Salaffi 2004 [V])', () => {
    const c = compareScores(6, 4);
    expect(c.category).toBe('much-better');
    expect(c.delta).toBe(-2);
    expect(c.relative).toBeCloseTo(-0.333, 3);
  });

  it('the saddle moved 10 mm along a post at 73° goes back 2.9 mm and up 9.6 mm (geometry [D])', () => {
    const m = seatPostMove(10, 73);
    expect(m.setback).toBeCloseTo(2.9, 1);
    expect(m.vertical).toBeCloseTo(9.6, 1);
  });

  it('inseam 840 mm minus 100 mm gives 740 mm ([CP])', () => {
    expect(byMethod(840, 'inseam-minus-100').value).toBe(740);
  });

  it('static knee flexion of 25–30° corresponds to about 33–38° dynamic (add ~8°, Bini & Hume 2016 [V])', () => {
    expect(staticToDynamicKneeFlexion(25).value).toBeCloseTo(33.2, 6);
    expect(staticToDynamicKneeFlexion(30).value).toBeCloseTo(38.2, 6);
    expect(Math.round(staticToDynamicKneeFlexion(25).value)).toBe(33);
    expect(Math.round(staticToDynamicKneeFlexion(30).value)).toBe(38);
  });
});
