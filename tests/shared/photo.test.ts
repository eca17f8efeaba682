import { describe, expect, it } from 'vitest';
import * as math from 'mathjs';
import fc from 'fast-check';
import { FitInputError } from '@shared/fit/errors';
import {
  dynamicToStaticKneeFlexion,
  includedAngle,
  isCrankLevelWarning,
  ISO_5775_WHEEL_SIZES,
  measurePhoto,
  parseTyreSize,
  photoScale,
  STATIC_TO_DYNAMIC_KNEE_DEG,
  VIDEO_2D_UNDERESTIMATE_DEG,
} from '@shared/fit/photo';

const deg = (r: number) => (r * 180) / Math.PI;

describe('joint angles from marked points', () => {
  it('reads 90° of knee flexion from a 3-4-5 triangle (hip 300 px above the knee, ankle 400 px ahead) [D]', () => {
    const r = measurePhoto({ facing: 'right', points: { hip: { x: 400, y: 100 }, knee: { x: 400, y: 400 }, ankle: { x: 800, y: 400 } } });
    expect(r.kneeFlexion?.value).toBeCloseTo(90, 9);
  });

  it('reads 30° of knee flexion from a 30-60-90 layout (interior angle 150°) [D]', () => {
    const r = measurePhoto({
      facing: 'right',
      points: { hip: { x: 500, y: 300 }, knee: { x: 500, y: 500 }, ankle: { x: 500 + 100, y: 500 + 100 * Math.sqrt(3) } },
    });
    expect(r.kneeFlexion?.value).toBeCloseTo(30, 9);
  });

  it('gives the hip angle (shoulder–hip–knee) and ankle angle (knee–ankle–toe)', () => {
    const r = measurePhoto({
      facing: 'right',
      points: {
        shoulder: { x: 700, y: 100 }, hip: { x: 400, y: 400 }, knee: { x: 700, y: 400 },
        ankle: { x: 700, y: 800 }, toe: { x: 900, y: 800 },
      },
    });
    expect(r.hipAngle?.value).toBeCloseTo(45, 9);
    expect(r.ankleAngle?.value).toBeCloseTo(90, 9);
  });

  it('agrees with mathjs on random triangles', () => {
    fc.assert(
      fc.property(
        fc.tuple(fc.integer({ min: 0, max: 2000 }), fc.integer({ min: 0, max: 2000 })),
        fc.tuple(fc.integer({ min: 0, max: 2000 }), fc.integer({ min: 0, max: 2000 })),
        fc.tuple(fc.integer({ min: 0, max: 2000 }), fc.integer({ min: 0, max: 2000 })),
        ([ax, ay], [bx, by], [cx, cy]) => {
          fc.pre(Math.hypot(ax - bx, ay - by) >= 5 && Math.hypot(cx - bx, cy - by) >= 5);
          const u = [ax - bx, ay - by];
          const w = [cx - bx, cy - by];
          const cos = (math.dot(u, w) as number) / ((math.norm(u) as number) * (math.norm(w) as number));
          const expected = deg(math.acos(Math.max(-1, Math.min(1, cos))) as number);
          expect(includedAngle({ x: ax, y: ay }, { x: bx, y: by }, { x: cx, y: cy }).degrees).toBeCloseTo(expected, 6);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('refuses points that coincide, naming the point', () => {
    try {
      measurePhoto({ facing: 'right', points: { hip: { x: 10, y: 10 }, knee: { x: 10, y: 10 }, ankle: { x: 50, y: 90 } } });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(FitInputError);
      expect((e as FitInputError).field).toBe('points.hip');
    }
  });

  it('refuses NaN coordinates and a photo with nothing to measure', () => {
    expect(() => measurePhoto({ facing: 'left', points: { hip: { x: Number.NaN, y: 1 } } })).toThrow(FitInputError);
    expect(() => measurePhoto({ facing: 'left', points: { hip: { x: 1, y: 1 } } })).toThrow(/Mark at least/);
  });
});

describe('the photo scale', () => {
  it('takes mm per pixel from a rim bead-seat diameter (ISO 5775 [V])', () => {
    const s = photoScale({ kind: 'wheel', tyre: '25-622', diameter: 'bead-seat', from: { x: 0, y: 0 }, to: { x: 622, y: 0 } }, 1);
    expect(s.mmPerPixel.value).toBeCloseTo(1, 12);
    expect(s.mmPerPixel.plusMinus).toBeCloseTo(2 / 622, 12);
    expect(s.how).toContain('700C');
  });

  it('takes the tyre outside diameter as BSD + 2 × width, with its tolerance (TRADE §7 [V2/D])', () => {
    const s = photoScale({ kind: 'wheel', tyre: '25-622', diameter: 'outside', from: { x: 0, y: 0 }, to: { x: 0, y: 674.5 } }, 0);
    expect(s.knownLengthMm).toBeCloseTo(674.5, 9);
    expect(s.mmPerPixel.plusMinus).toBeCloseTo(2.5 / 674.5, 9);
  });

  it('takes the scale from a crank or any known length (a 3-4-5 diagonal)', () => {
    const crank = photoScale({ kind: 'crank', crankLength: 170, from: { x: 0, y: 0 }, to: { x: 102, y: 136 } }, 0);
    expect(crank.mmPerPixel.value).toBeCloseTo(1, 12); // 102-136-170 is 3-4-5 × 34
    const known = photoScale({ kind: 'known', lengthMm: 500, toleranceMm: 5, from: { x: 0, y: 0 }, to: { x: 300, y: 400 } }, 0);
    expect(known.mmPerPixel.value).toBe(1);
    expect(known.mmPerPixel.plusMinus).toBeCloseTo(0.01, 12);
  });

  it('refuses unknown or malformed tyre sizes and implausible widths', () => {
    expect(() => parseTyreSize('25-623')).toThrow(FitInputError);
    expect(() => parseTyreSize('700x25c')).toThrow(/ISO 5775/);
    expect(() => parseTyreSize('10-622')).toThrow(/wide/);
    expect(() => photoScale({ kind: 'wheel', tyre: '25-999', diameter: 'outside', from: { x: 0, y: 0 }, to: { x: 1, y: 600 } })).toThrow(FitInputError);
    expect(() => photoScale({ kind: 'crank', crankLength: 170, from: { x: 5, y: 5 }, to: { x: 5, y: 5 } })).toThrow(/coincide/);
  });

  it('lists the ISO 5775 bead-seat sizes (ISO 5775 [V], TRADE §7) for a picker, each with a common name and where the name comes from', () => {
    expect(ISO_5775_WHEEL_SIZES.map((w) => w.bsd)).toEqual([635, 630, 622, 590, 584, 571, 559, 507, 451, 406, 305]);
    for (const w of ISO_5775_WHEEL_SIZES) expect(w.commonName.length).toBeGreaterThan(1);
    // 584 mm is 650B / 27.5" (ISO 5775 [V], TRADE §7).
    expect(parseTyreSize(' 50-584 ').wheel.commonName).toContain('650B');
  });
});

describe('the knee-to-spindle offset', () => {
  const points = { kneeFront: { x: 520, y: 300 }, spindle: { x: 500, y: 600 } };
  const scale = { kind: 'crank' as const, crankLength: 170, from: { x: 500, y: 600 }, to: { x: 670, y: 600 } };

  it('is positive when the knee is ahead of the spindle, whichever way the rider faces', () => {
    expect(measurePhoto({ facing: 'right', points, scale }).kneeToSpindleMm?.value).toBeCloseTo(20, 9);
    expect(measurePhoto({ facing: 'left', points, scale }).kneeToSpindleMm?.value).toBeCloseTo(-20, 9);
  });

  it('warns when a marked bottom bracket shows the crank more than 5° off level (our tolerance)', () => {
    const level = measurePhoto({ facing: 'right', points: { ...points, bottomBracket: { x: 330, y: 604 } }, scale });
    expect(level.notes.join(' ')).not.toMatch(/from level/);
    // 170 px of crank rising 100 px: atan(100/170) ≈ 30°.
    const tilted = measurePhoto({ facing: 'right', points: { ...points, bottomBracket: { x: 330, y: 700 } }, scale });
    expect(tilted.notes.join(' ')).toMatch(/crank is 30° from level/);
    expect(tilted.notes.filter(isCrankLevelWarning)).toHaveLength(1);
    expect(level.notes.filter(isCrankLevelWarning)).toHaveLength(0);
    expect(() => measurePhoto({ facing: 'right', points: { ...points, bottomBracket: points.spindle }, scale })).toThrow(/coincide/);
  });

  it('needs a scale to be given in millimetres', () => {
    const r = measurePhoto({ facing: 'right', points: { ...points, hip: { x: 0, y: 0 }, knee: { x: 100, y: 100 }, ankle: { x: 100, y: 300 } } });
    expect(r.kneeToSpindleMm).toBeNull();
    expect(r.thighMm).toBeNull();
    expect(r.notes.join(' ')).toMatch(/known length/);
  });

  it('carries click and scale uncertainty: ±(2N·s + |Δx|·δs)', () => {
    const r = measurePhoto({ facing: 'right', points, scale, clickPrecisionPx: 2 });
    const s = 1;
    const ds = (2 * 2) / 170;
    expect(r.kneeToSpindleMm?.plusMinus).toBeCloseTo(2 * 2 * s + 20 * ds, 9);
  });

  it('gives thigh and shank lengths in mm for the leg model', () => {
    const r = measurePhoto({
      facing: 'right',
      points: { hip: { x: 500, y: 0 }, knee: { x: 800, y: 400 }, ankle: { x: 800, y: 800 } },
      scale: { kind: 'known', lengthMm: 1000, from: { x: 0, y: 0 }, to: { x: 1000, y: 0 } },
      clickPrecisionPx: 0,
    });
    expect(r.thighMm?.value).toBeCloseTo(500, 9);
    expect(r.shankMm?.value).toBeCloseTo(400, 9);
  });
});

describe('uncertainty from click precision', () => {
  it('is zero with perfect clicks and grows with the click precision', () => {
    const pts = { hip: { x: 400, y: 100 }, knee: { x: 400, y: 400 }, ankle: { x: 800, y: 400 } };
    expect(measurePhoto({ facing: 'right', points: pts, clickPrecisionPx: 0 }).kneeFlexion?.plusMinus).toBe(0);
    const one = measurePhoto({ facing: 'right', points: pts, clickPrecisionPx: 1 }).kneeFlexion?.plusMinus ?? 0;
    const three = measurePhoto({ facing: 'right', points: pts, clickPrecisionPx: 3 }).kneeFlexion?.plusMinus ?? 0;
    expect(three).toBeCloseTo(3 * one, 9);
    // 3-4-5: gradients 1/300 and 1/400 at the arms; at the vertex |(1/300, 1/400)| = 1/240.
    expect(one).toBeCloseTo(deg(1 / 300 + 1 / 400 + 1 / 240), 9);
  });

  it('bounds the real change when every point moves up to N pixels (first-order worst case)', () => {
    const jitter = fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }));
    fc.assert(
      fc.property(
        fc.double({ min: 150, max: 600, noNaN: true }),
        fc.double({ min: 150, max: 600, noNaN: true }),
        fc.double({ min: 20, max: 170, noNaN: true }),
        fc.double({ min: 0.5, max: 3, noNaN: true }),
        jitter, jitter, jitter,
        (la, lc, interior, n, ja, jb, jc) => {
          const b = { x: 1000, y: 1000 };
          const a = { x: b.x, y: b.y - la };
          const t = ((90 - interior) * Math.PI) / 180;
          const c = { x: b.x + lc * Math.cos(t), y: b.y - lc * Math.sin(t) };
          const move = (p: { x: number; y: number }, [r, th]: [number, number]) => ({ x: p.x + n * r * Math.cos(th), y: p.y + n * r * Math.sin(th) });
          const base = includedAngle(a, b, c);
          const moved = includedAngle(move(a, ja), move(b, jb), move(c, jc)).degrees;
          // First order plus a second-order allowance of (N / shortest arm)² radians.
          const slack = deg((n / Math.min(la, lc)) ** 2) * 3;
          expect(Math.abs(moved - base.degrees)).toBeLessThanOrEqual(base.degreesPerPixel * n + slack + 1e-9);
        },
      ),
      { numRuns: 500 },
    );
  });
});

describe('static and dynamic knee angles', () => {
  it('uses the published sizes: 8.2 ± 5° (Bini & Hume 2016 [V]) and 2.2° (Fonda 2014 [V])', () => {
    expect(STATIC_TO_DYNAMIC_KNEE_DEG.mean).toBe(8.2);
    expect(STATIC_TO_DYNAMIC_KNEE_DEG.sd).toBe(5);
    expect(VIDEO_2D_UNDERESTIMATE_DEG).toBe(2.2);
    expect(dynamicToStaticKneeFlexion(38.2).value).toBeCloseTo(30, 9);
    expect(dynamicToStaticKneeFlexion(38.2).range).toEqual([expect.closeTo(25, 9), expect.closeTo(35, 9)]);
  });

  it('adds the static-vs-dynamic note to every knee angle', () => {
    const r = measurePhoto({ facing: 'right', points: { hip: { x: 400, y: 100 }, knee: { x: 400, y: 400 }, ankle: { x: 800, y: 400 } } });
    expect(r.notes.join(' ')).toMatch(/8\.2° \(± 5°\).*2\.2°/);
  });
});
