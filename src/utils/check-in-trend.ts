import { BODY_REGIONS, REGION_INFO, type BodyRegion } from '@shared/fit/triage';
import { PARAMETER_INFO, SETUP_PARAMETERS, type SetupParameter } from '@shared/fit/setup';
import type { CheckInTrend } from '@/api/check-ins';

/**
 * The trend as rows (one per record: the starting point, then each check-in) and as chart
 * series. A region the rider did not mark on a check-in counts as no pain (0): the body map
 * asks where it hurts, so an unmarked place did not hurt.
 */
export interface TrendRow {
  key: string;
  /** Milliseconds since the epoch, for the time axis. */
  at: number;
  label: string;
  comfort: number | null;
  pains: Partial<Record<BodyRegion, number>>;
}

export interface StepMarker {
  at: number;
  label: string;
}

/** A calendar date (YYYY-MM-DD) or an instant, as milliseconds; dates are read at noon UTC. */
export function timeOf(value: string): number {
  return /^\d{4}-\d{2}-\d{2}$/.test(value) ? Date.parse(`${value}T12:00:00Z`) : Date.parse(value);
}

export function trendRows(trend: CheckInTrend): TrendRow[] {
  const rows: TrendRow[] = [];
  if (trend.baseline) {
    rows.push({
      key: 'baseline',
      at: timeOf(trend.baseline.date),
      label: 'Starting point',
      comfort: trend.baseline.comfort,
      pains: Object.fromEntries(trend.baseline.pains.map((p) => [p.region, p.pain])),
    });
  }
  for (const c of [...trend.checkIns].sort((a, b) => timeOf(a.createdAt) - timeOf(b.createdAt))) {
    rows.push({ key: `check-in-${c.id}`, at: timeOf(c.createdAt), label: `Check-in on step ${c.stepIndex}`, comfort: c.comfort, pains: Object.fromEntries(c.pains.map((p) => [p.region, p.pain])) });
  }
  return rows;
}

/** Regions with any pain in any record, in body-map order. */
export function trendRegions(rows: readonly TrendRow[]): BodyRegion[] {
  const seen = new Set<BodyRegion>();
  for (const row of rows) for (const [region, pain] of Object.entries(row.pains)) if (pain !== undefined && pain > 0) seen.add(region as BodyRegion);
  return BODY_REGIONS.filter((r) => seen.has(r));
}

export function painAt(row: TrendRow, region: BodyRegion): number {
  return row.pains[region] ?? 0;
}

/**
 * The server sums a step up as "saddleHeight +3, crankLength -2.5"; this reads it as
 * "saddle height +3 mm, crank length −2.5 mm". Anything it does not recognise is kept as sent.
 */
export function readableSummary(summary: string): string {
  return summary.replace(/\b([a-zA-Z]+) ([+-]?\d+(?:\.\d+)?)/g, (whole, name: string, amount: string) => {
    if (!(SETUP_PARAMETERS as readonly string[]).includes(name)) return whole;
    const info = PARAMETER_INFO[name as SetupParameter];
    const n = Number(amount);
    return `${info.label} ${n > 0 ? '+' : n < 0 ? '−' : ''}${Math.abs(n)}${info.unit === 'deg' ? '°' : ' mm'}`;
  });
}

/** "Step 2: saddle height +3 mm" at the day each step was applied. */
export function stepMarkers(trend: CheckInTrend): StepMarker[] {
  return trend.steps.map((s) => ({ at: timeOf(s.appliedOn), label: `Step ${s.index}: ${readableSummary(s.summary)}` }));
}

export function regionLabel(region: BodyRegion): string {
  return REGION_INFO[region].label;
}

/** "9 Mar" (with the year when it is not this year). Calendar dates sit at noon UTC, which is the same day in the viewer's zone. */
export function shortDate(at: number): string {
  const date = new Date(at);
  const sameYear = date.getFullYear() === new Date().getFullYear();
  return new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short', ...(sameYear ? {} : { year: 'numeric' }) }).format(date);
}

const REGION_PATTERN = new RegExp(`(?<![\\w-])(${[...BODY_REGIONS].sort((a, b) => b.length - a.length).join('|')})(?![\\w-])`, 'g');

/** The analysis names body areas by id ("knee-front-left"); riders and fitters read "front of knee, left". */
export function readableRegions(text: string): string {
  return text.replace(REGION_PATTERN, (id) => {
    const label = REGION_INFO[id as BodyRegion].label;
    return label.charAt(0).toLowerCase() + label.slice(1);
  });
}
