import { describe, expect, it } from 'vitest';
import { checkInReasonText, stepMarkers, trendRows } from '@/utils/check-in-trend';
import type { CheckInTrend } from '@/api/check-ins';

/** The client's trend chart data and wording; no browser needed, but it lives with the client tests. */
describe('the check-in trend', () => {
  const painAt = (pain: number) => [{ region: 'knee-front-left' as const, pain }];
  const checkIn = (id: number, createdAt: string, pain: number) => ({ id, planId: 1, stepIndex: 1, createdAt, rides: 3, minutesRidden: 90, comfort: 6, pains: painAt(pain), numbness: false, note: '' });

  it('orders same-day check-ins by their time and keeps the starting point and the step before them', () => {
    // The intake was re-sent after the step: the starting point still comes first.
    const trend: CheckInTrend = {
      baseline: { date: '2026-03-09T18:00:00.000Z', comfort: null, pains: painAt(3) },
      checkIns: [checkIn(2, '2026-03-09T16:00:00.000Z', 5), checkIn(1, '2026-03-09T08:00:00.000Z', 6)],
      steps: [{ planId: 1, index: 1, appliedOn: '2026-03-09', summary: 'saddleHeight +3' }],
    };
    const rows = trendRows(trend);
    expect(rows.map((r) => r.pains['knee-front-left'])).toEqual([3, 6, 5]);
    expect(rows.map((r) => r.at)).toEqual([...rows.map((r) => r.at)].sort((a, b) => a - b));
    const [marker] = stepMarkers(trend);
    expect(marker!.at).toBeGreaterThan(rows[0]!.at);
    expect(marker!.at).toBeLessThan(rows[1]!.at);
  });

  it('words a first check-in as compared with the starting point', () => {
    const change = { reference: 3, current: 6, delta: 3, relative: 1, category: 'much-worse' as const };
    const regions = [{ region: 'knee-front-left' as const, painVsBaseline: change, painVsPrevious: change, comfortVsBaseline: null, comfortVsPrevious: null }];
    expect(checkInReasonText('Much worse since the last check-in (2+ points or 30 %): knee-front-left.', { regions })).toContain('since your starting point');
    const later = [{ ...regions[0]!, painVsPrevious: { ...change, reference: 4 } }];
    expect(checkInReasonText('Much worse since the last check-in: knee-front-left.', { regions: later })).toContain('since the last check-in');
  });
});
