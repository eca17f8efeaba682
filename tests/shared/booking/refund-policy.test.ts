import { describe, expect, it } from 'vitest';
import { capToRefundable, DEFAULT_CANCELLATION_POLICY, decideRefund, formatMoney, fromMinorUnits, minorUnitDigits, toMinorUnits } from '@shared/booking';

const startsAt = new Date('2027-05-10T10:00:00Z');
const hoursBefore = (h: number) => new Date(startsAt.getTime() - h * 3_600_000);

/** The invented demo policy: full refund ≥ 24 h before, half inside 24 h, none after the start. */
describe('decideRefund with the default policy', () => {
  it.each([
    ['rider, 72 h before', 'rider', 72, 9000, true],
    ['rider, exactly 24 h before', 'rider', 24, 9000, true],
    ['rider, 23.9 h before', 'rider', 23.9, 4500, false],
    ['rider, 1 minute before', 'rider', 1 / 60, 4500, false],
    ['rider, at the start', 'rider', 0, 0, false],
    ['rider, after the start', 'rider', -2, 0, false],
    ['fitter, 2 h before', 'fitter', 2, 9000, false],
    ['admin, 100 h before', 'admin', 100, 9000, true],
  ] as const)('%s → %i minor units', (_label, cancelledBy, hours, expected, mayReschedule) => {
    const decision = decideRefund({ paidMinor: 9000, startsAt, now: hoursBefore(hours), cancelledBy, policy: DEFAULT_CANCELLATION_POLICY });
    expect(decision.amountMinor).toBe(expected);
    expect(decision.mayReschedule).toBe(mayReschedule);
    expect(decision.reason).toEqual(expect.any(String));
  });

  it('rounds a share down to whole minor units', () => {
    const decision = decideRefund({ paidMinor: 999, startsAt, now: hoursBefore(1), cancelledBy: 'rider', policy: DEFAULT_CANCELLATION_POLICY });
    expect(decision.amountMinor).toBe(499);
  });

  it('follows a clinic policy with other shares and window', () => {
    const policy = { windowHours: 48, earlyRefundShare: 0.9, lateRefundShare: 0 };
    expect(decideRefund({ paidMinor: 10000, startsAt, now: hoursBefore(50), cancelledBy: 'rider', policy }).amountMinor).toBe(9000);
    expect(decideRefund({ paidMinor: 10000, startsAt, now: hoursBefore(47), cancelledBy: 'rider', policy }).amountMinor).toBe(0);
  });
});

describe('money in minor units', () => {
  it('handles two-decimal and zero-decimal currencies', () => {
    expect(minorUnitDigits('EUR')).toBe(2);
    expect(minorUnitDigits('jpy')).toBe(0);
    expect(toMinorUnits(90, 'EUR')).toBe(9000);
    expect(toMinorUnits(12000, 'JPY')).toBe(12000);
    expect(fromMinorUnits(4550, 'GBP')).toBe(45.5);
    expect(formatMoney(12000, 'JPY', 'en-GB')).toBe('JP¥12,000');
    expect(formatMoney(9000, 'EUR', 'en-GB')).toBe('€90.00');
  });
});

describe('capToRefundable', () => {
  const late = decideRefund({ paidMinor: 9500, startsAt: new Date('2027-03-09T10:00:00Z'), now: new Date('2027-03-08T15:00:00Z'), cancelledBy: 'rider', policy: DEFAULT_CANCELLATION_POLICY });

  it('keeps the policy amount when enough of the payment is left (half of €95 after a €20 refund: €47.50)', () => {
    expect(late.amountMinor).toBe(4750);
    expect(capToRefundable(late, 9500 - 2000, 'EUR')).toEqual(late);
  });

  it('refunds only what is left, and says why, when an earlier refund took more', () => {
    const capped = capToRefundable(late, 3000, 'EUR');
    expect(capped.amountMinor).toBe(3000);
    expect(capped.reason).toMatch(/refunded earlier, so €30\.00 is what is left to refund/);
    expect(capToRefundable(late, -5, 'EUR').amountMinor).toBe(0);
  });
});
