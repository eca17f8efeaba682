import { describe, expect, it } from 'vitest';
import * as fit from '@shared/fit';
import { ensureFinite, FitInputError, requireFinite, requireRange } from '@shared/fit/errors';
import { formatAngle, formatLength, formatSignedLength, fromMm, inchesToMm, MM_PER_INCH, mmToInches, toMm } from '@shared/units';

describe('units (mm inside, inches only for display)', () => {
  it('uses exactly 25.4 mm per inch (international inch, 1959 [V])', () => {
    expect(MM_PER_INCH).toBe(25.4);
    expect(mmToInches(254)).toBeCloseTo(10, 12);
    expect(inchesToMm(1)).toBe(25.4);
    expect(toMm(2, 'in')).toBeCloseTo(50.8, 12);
    expect(toMm(172.5, 'mm')).toBe(172.5);
    expect(fromMm(50.8, 'in')).toBeCloseTo(2, 12);
    expect(fromMm(50.8, 'mm')).toBe(50.8);
  });

  it('formats lengths and angles for screens', () => {
    expect(formatLength(750)).toBe('750 mm');
    expect(formatLength(172.5)).toBe('172.5 mm');
    expect(formatLength(254, 'in')).toBe('10.00 in');
    expect(formatLength(749.96)).toBe('750 mm');
    expect(formatAngle(32.25)).toBe('32.3°');
    expect(formatSignedLength(4)).toBe('+4 mm');
    expect(formatSignedLength(-2.5)).toBe('−2.5 mm');
    expect(formatSignedLength(0)).toBe('±0 mm');
    expect(formatSignedLength(25.4, 'in')).toBe('+1.00 in');
  });

  it('refuses NaN and infinities with a typed error', () => {
    expect(() => mmToInches(Number.NaN)).toThrow(FitInputError);
    expect(() => inchesToMm(Infinity)).toThrow(FitInputError);
    expect(() => formatSignedLength(Number.NaN)).toThrow(FitInputError);
    expect(() => formatAngle(Number.NaN)).toThrow(FitInputError);
  });
});

describe('FitInputError', () => {
  it('names the field and says what is wrong', () => {
    const e = new FitInputError('inseam', 'inseam must be a number');
    expect(e).toBeInstanceOf(Error);
    expect(e.name).toBe('FitInputError');
    expect(e.field).toBe('inseam');
    expect(() => requireRange('crank', 400, 100, 220, 'mm')).toThrow('crank must be between 100 and 220 mm (got 400 mm).');
    expect(() => requireRange('angle', 2, 5, 9)).toThrow('angle must be between 5 and 9 (got 2).');
    expect(() => requireFinite('x', Number.NaN)).toThrow(/finite/);
    expect(() => ensureFinite('result', Number.NaN)).toThrow(/could not be computed/);
    expect(ensureFinite('result', 3)).toBe(3);
  });

  it('reports a whole-object problem against the root name', () => {
    expect(() => fit.estimateSaddleHeight(null as never)).toThrow(expect.objectContaining({ field: 'saddleHeight' }));
  });

  it('keeps internals out of the public modules', async () => {
    const planner = await import('@shared/fit/planner');
    const photo = await import('@shared/fit/photo');
    for (const name of ['buildPlanFrom', 'effectiveLimits', 'oneStepRevertSource', 'stepInstructions', 'EPS']) expect(planner).not.toHaveProperty(name);
    for (const name of ['distance', 'requireApart', 'MIN_POINT_SEPARATION_PX']) expect(photo).not.toHaveProperty(name);
    expect(fit).not.toHaveProperty('buildPlanFrom');
  });

  it('is exported from the fit entry point with every area', () => {
    for (const name of ['estimateSaddleHeight', 'measurePhoto', 'buildPlan', 'validatePlan', 'screenRedFlags', 'rankFitCauses', 'analyseCheckIn', 'setupSchema']) {
      expect(fit).toHaveProperty(name);
    }
  });
});
