import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { keepIfSameWhenShown, lengthForDisplay, lengthForSending, roundMm, sameWhenShown, typedToMm } from '@shared/length-entry';
import { BODY_MEASURES, asSentence, keepShownLengths, measureSchema, measureTextFor } from '@shared/rider';
import { PARAMETER_INFO, type Setup } from '@shared/fit/setup';

/** Any stored length: a tenth-of-a-millimetre step, as `roundMm` leaves it. */
const storedMm = fc.integer({ min: -5000, max: 30000 }).map((tenths) => tenths / 10);

describe('lengthForDisplay', () => {
  it('shows tenths of a millimetre and hundredths of an inch', () => {
    expect(lengthForDisplay(720, 'mm')).toBe(720);
    expect(lengthForDisplay(172.5, 'mm')).toBe(172.5);
    expect(lengthForDisplay(720, 'in')).toBe(28.35);
    expect(lengthForDisplay(1750, 'in')).toBe(68.9);
    expect(lengthForDisplay(29.25 * 25.4, 'in')).toBe(29.25);
  });
});

describe('typedToMm', () => {
  it('keeps the stored millimetres when the rider leaves the shown number as it was', () => {
    expect(typedToMm(28.35, 'in', 720)).toBe(720);
    expect(typedToMm(68.9, 'in', 1750)).toBe(1750);
    expect(typedToMm(2.36, 'in', 60)).toBe(60);
    expect(typedToMm(720, 'mm', 720)).toBe(720);
  });

  it('converts a number the rider changed, to the storage step', () => {
    expect(typedToMm(28.4, 'in', 720)).toBe(721.4);
    expect(typedToMm(29.25, 'in', null)).toBe(743);
    expect(typedToMm(721.44, 'mm', 720)).toBe(721.4);
  });

  it('treats an emptied box, or anything not a finite number, as no value', () => {
    expect(typedToMm(null, 'in', 720)).toBeNull();
    expect(typedToMm(Number.NaN, 'mm', 720)).toBeNull();
  });

  it('never moves a stored value that is shown and given back unchanged, in either unit', () => {
    fc.assert(
      fc.property(storedMm, fc.constantFrom('mm' as const, 'in' as const), (mm, unit) => {
        expect(typedToMm(lengthForDisplay(mm, unit), unit, mm)).toBe(mm);
      }),
    );
  });
});

describe('lengthForSending', () => {
  it('sends a value the server converts back to exactly the stored millimetres', () => {
    fc.assert(
      fc.property(storedMm, fc.constantFrom('mm' as const, 'in' as const), (mm, unit) => {
        expect(roundMm(unit === 'in' ? lengthForSending(mm, unit) * 25.4 : lengthForSending(mm, unit))).toBe(mm);
      }),
    );
  });

  it('passes through the server schema unchanged for the inseam and height limits', () => {
    const inseam = measureSchema(BODY_MEASURES.inseam, 'in');
    expect(inseam.parse(lengthForSending(820, 'in'))).toBe(820);
    expect(measureSchema(BODY_MEASURES.height, 'in').parse(lengthForSending(1750, 'in'))).toBe(1750);
    // The rounded figure alone would drift; this is why forms send the unrounded one.
    expect(inseam.parse(lengthForDisplay(820, 'in'))).toBe(819.9);
  });
});

describe('sameWhenShown and keepIfSameWhenShown', () => {
  it('calls two lengths the same when the unit cannot tell them apart', () => {
    expect(sameWhenShown(720, 720.1, 'in')).toBe(true);
    expect(sameWhenShown(720, 720.1, 'mm')).toBe(false);
    expect(sameWhenShown(720, 720.3, 'in')).toBe(false);
  });

  it('keeps the current value only when the new one looks the same', () => {
    expect(keepIfSameWhenShown(720.1, 720, 'in')).toBe(720);
    expect(keepIfSameWhenShown(721.4, 720, 'in')).toBe(721.4);
    expect(keepIfSameWhenShown(720.1, 720, 'mm')).toBe(720.1);
    expect(keepIfSameWhenShown(720.1, null, 'in')).toBe(720.1);
    expect(keepIfSameWhenShown(720.1, undefined, 'in')).toBe(720.1);
  });
});

describe('keepShownLengths', () => {
  const current: Setup = {
    saddleHeight: 720, saddleSetback: 60, saddleTilt: -1, reach: 520, drop: 100, stemLength: 100,
    spacerStack: 20, crankLength: 172.5, stack: 20, cleatForeAft: 10, cleatRotation: 2,
  };

  it('undoes the drift of a setup sent back as rounded inches, and keeps real changes and angles', () => {
    const drifted: Setup = { ...current, saddleHeight: 720.1, saddleSetback: 59.9, reach: 519.9, drop: 100.1, spacerStack: 20.1, stemLength: 110, saddleTilt: -1.5 };
    expect(keepShownLengths(drifted, current, 'in')).toEqual({ ...current, stemLength: 110, saddleTilt: -1.5 });
  });

  it('changes nothing for a first measurement or a setup typed in millimetres', () => {
    const measured = { ...current, saddleHeight: 720.1 };
    expect(keepShownLengths(measured, null, 'in')).toEqual(measured);
    expect(keepShownLengths(measured, current, 'mm')).toEqual(measured);
  });
});

describe('guide texts', () => {
  it('reads each guide as one sentence with a single closing stop', () => {
    expect(asSentence('from the centre of the bottom bracket')).toBe('From the centre of the bottom bracket.');
    expect(asSentence('Measure twice and use the average.')).toBe('Measure twice and use the average.');
    expect(asSentence('Is it level?')).toBe('Is it level?');
    expect(asSentence('  ')).toBe('');
    for (const info of [...Object.values(BODY_MEASURES), ...Object.values(PARAMETER_INFO)]) {
      expect(asSentence(info.measure)).not.toMatch(/\.\.$/);
    }
  });

  it('quotes the inseam stance in the unit the rider is viewing', () => {
    expect(measureTextFor(BODY_MEASURES.inseam, 'mm')).toContain('15 cm');
    expect(measureTextFor(BODY_MEASURES.inseam, 'in')).toContain('6 in');
    expect(measureTextFor(BODY_MEASURES.inseam, 'in')).not.toContain('cm');
    expect(measureTextFor(BODY_MEASURES.height, 'in')).toBe(BODY_MEASURES.height.measure);
  });
});
