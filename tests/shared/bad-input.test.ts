/**
 * Exported helpers refuse bad input with FitInputError and never return NaN (audit item: each of
 * these once returned NaN, a wrong value or an untyped error).
 */
import { describe, expect, it } from 'vitest';
import { compareScores } from '@shared/fit/checkin';
import { FitInputError } from '@shared/fit/errors';
import { includedAngle, photoScale, video2dTo3dKneeAngle } from '@shared/fit/photo';
import { painCapFactor } from '@shared/fit/planner';
// Internals, by direct path: they are not part of the public modules but are checked here.
import { distance } from '@shared/fit/photo/geometry';
import { stepInstructions } from '@shared/fit/planner/instructions';
import { gattiSaddleHeightCm, spindleToBottomBracket } from '@shared/fit/saddle-height';
import { addDays, couplingCompensation, daysBetween } from '@shared/fit/setup';
import { BASE } from './planner-fixtures';

/** The call throws a FitInputError naming `field`. */
function refuses(call: () => unknown, field: string) {
  try {
    call();
  } catch (e) {
    expect(e).toBeInstanceOf(FitInputError);
    expect((e as FitInputError).field).toBe(field);
    return;
  }
  expect.unreachable(`expected a FitInputError for ${field}`);
}

describe('exported helpers refuse bad input with a typed error', () => {
  it('spindleToBottomBracket: NaN, negative or absurd lengths', () => {
    refuses(() => spindleToBottomBracket(Number.NaN, 170), 'spindleLength');
    refuses(() => spindleToBottomBracket(-900, 170), 'spindleLength');
    refuses(() => spindleToBottomBracket(900, -170), 'crankLength');
    expect(spindleToBottomBracket(900, 170)).toBe(730);
  });

  it('distance and includedAngle: infinite or NaN coordinates are named, not called "coincide"', () => {
    refuses(() => distance({ x: Number.NaN, y: 0 }, { x: 1, y: 1 }), 'points.first.x');
    refuses(() => includedAngle({ x: 0, y: 0 }, { x: 10, y: Infinity }, { x: 20, y: 0 }, ['hip', 'knee', 'ankle']), 'points.knee.y');
    refuses(() => includedAngle({ x: Number.NaN, y: 0 }, { x: 10, y: 0 }, { x: 20, y: 5 }, ['hip', 'knee', 'ankle']), 'points.hip.x');
    expect(distance({ x: 0, y: 0 }, { x: 3, y: 4 })).toBe(5);
  });

  it('compareScores: NaN and scores outside 0–10', () => {
    refuses(() => compareScores(Number.NaN, 5), 'reference');
    refuses(() => compareScores(-2, 5), 'reference');
    refuses(() => compareScores(5, 11), 'current');
  });

  it('couplingCompensation: a NaN crank, stack or cleat value', () => {
    refuses(() => couplingCompensation(BASE, BASE, { ...BASE, crankLength: Number.NaN }), 'setup.crankLength');
    refuses(() => couplingCompensation({ ...BASE, stack: Infinity }, BASE, BASE), 'reference.stack');
    expect(couplingCompensation(BASE, BASE, { ...BASE, crankLength: 170 })).toBe(2.5);
  });

  it('daysBetween and addDays: malformed dates and fractional or absurd day counts', () => {
    refuses(() => daysBetween('xx', '2025-03-01'), 'from');
    refuses(() => daysBetween('2025-03-01', '2025-02-30'), 'to');
    refuses(() => addDays('xx', 3), 'date');
    refuses(() => addDays('2025-03-01', 1.5), 'days');
    refuses(() => addDays('2025-03-01', Number.NaN), 'days');
    refuses(() => addDays('2025-03-01', 1e9), 'days');
    expect(addDays('2025-02-27', 2)).toBe('2025-03-01');
  });

  it('photoScale: a negative click precision', () => {
    refuses(() => photoScale({ kind: 'known', lengthMm: 500, from: { x: 0, y: 0 }, to: { x: 500, y: 0 } }, -5), 'clickPrecisionPx');
  });

  it('painCapFactor: NaN and scores outside 0–10', () => {
    refuses(() => painCapFactor(Number.NaN), 'pain');
    refuses(() => painCapFactor(-1), 'pain');
    refuses(() => painCapFactor(12), 'pain');
  });

  it('stepInstructions: never prints "NaN mm"', () => {
    const change = { parameter: 'saddleHeight' as const, from: 740, to: Number.NaN, delta: Number.NaN, coupledTo: null };
    refuses(() => stepInstructions([change], BASE, BASE), 'changes.saddleHeight.delta');
  });

  it('video2dTo3dKneeAngle: no result past 180° (2D input at most 177.8°, Fonda 2014 [V] + [D])', () => {
    refuses(() => video2dTo3dKneeAngle(179), 'kneeAngle2d');
    expect(video2dTo3dKneeAngle(177.8)).toBeCloseTo(180, 9);
  });

  it('gattiSaddleHeightCm: negative or absurd inputs', () => {
    refuses(() => gattiSaddleHeightCm(-85, 35, 73), 'inseamCm');
    refuses(() => gattiSaddleHeightCm(85, Number.NaN, 73), 'kneeFlexion');
    refuses(() => gattiSaddleHeightCm(85, 35, 120), 'seatTubeAngle');
  });
});
