import { BODY_REGIONS, REGION_INFO, type BodyRegion } from '@shared/fit/triage';
import { PARAMETER_INFO, SETUP_PARAMETERS, type SetupParameter } from '@shared/fit/setup';
import type { CheckInAnalysis } from '@shared/fit/checkin';
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
  /** "Step 2", when the whole label does not fit. */
  short: string;
  /** The day the step was made, as the rider chose it ("9 Mar"), whatever the viewer's zone. */
  day: string;
}

/** A calendar date (YYYY-MM-DD) or an instant, as milliseconds; dates are read at noon UTC. */
export function timeOf(value: string): number {
  return /^\d{4}-\d{2}-\d{2}$/.test(value) ? Date.parse(`${value}T12:00:00Z`) : Date.parse(value);
}

/** One minute: how far before the first record after it a starting point or step marker is drawn. */
const BEFORE = 60_000;

/**
 * Steps are stored as calendar days but check-ins at their real time, so a step is drawn at noon
 * UTC of its day, or just before the first check-in on it (or a later step) when that came earlier
 * (a morning check-in, a zone east of UTC). Sorted by time.
 */
export function stepMarkers(trend: CheckInTrend): StepMarker[] {
  return trend.steps
    .map((s) => {
      const after = trend.checkIns.filter((c) => c.planId === s.planId && c.stepIndex >= s.index).map((c) => timeOf(c.createdAt));
      const at = Math.min(timeOf(s.appliedOn), ...after.map((t) => t - BEFORE));
      return { at, label: `Step ${s.index}: ${readableSummary(s.summary)}`, short: `Step ${s.index}`, day: shortDay(s.appliedOn) };
    })
    .sort((a, b) => a.at - b.at);
}

/**
 * The starting point sits at the intake's submission time, but never after the first step or the
 * first check-in: the plan started from it, even if the rider sent updated answers later.
 */
export function trendRows(trend: CheckInTrend): TrendRow[] {
  const checkIns = [...trend.checkIns].sort((a, b) => timeOf(a.createdAt) - timeOf(b.createdAt) || a.id - b.id);
  const rows: TrendRow[] = [];
  if (trend.baseline) {
    const later = [...stepMarkers(trend).map((m) => m.at), ...checkIns.map((c) => timeOf(c.createdAt))].map((t) => t - BEFORE);
    rows.push({
      key: 'baseline',
      at: Math.min(timeOf(trend.baseline.date), ...later),
      label: 'Starting point',
      comfort: trend.baseline.comfort,
      pains: Object.fromEntries(trend.baseline.pains.map((p) => [p.region, p.pain])),
    });
  }
  for (const c of checkIns) {
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

export function regionLabel(region: BodyRegion): string {
  return REGION_INFO[region].label;
}

/** "9 Mar" (with the year when it is not this year). Calendar dates sit at noon UTC, which is the same day in the viewer's zone. */
export function shortDate(at: number): string {
  const date = new Date(at);
  const sameYear = date.getFullYear() === new Date().getFullYear();
  return new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short', ...(sameYear ? {} : { year: 'numeric' }) }).format(date);
}

/** "9 Mar" for a calendar date, read in UTC so the day is the one stored in every zone. */
export function shortDay(isoDate: string): string {
  const date = new Date(timeOf(isoDate));
  const sameYear = date.getUTCFullYear() === new Date().getUTCFullYear();
  return new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short', timeZone: 'UTC', ...(sameYear ? {} : { year: 'numeric' }) }).format(date);
}

const REGION_PATTERN = new RegExp(`(?<![\\w-])(${[...BODY_REGIONS].sort((a, b) => b.length - a.length).join('|')})(?![\\w-])`, 'g');

/** The analysis names body areas by id ("knee-front-left"); riders and fitters read "front of knee, left". */
export function readableRegions(text: string): string {
  return text.replace(REGION_PATTERN, (id) => {
    const label = REGION_INFO[id as BodyRegion].label;
    return label.charAt(0).toLowerCase() + label.slice(1);
  });
}

/**
 * The shared analysis words a change against the previous record as "since the last check-in",
 * but on a plan's first check-in the previous record is the starting point. When every region
 * was compared with the same numbers as the starting point, say so.
 */
export function checkInReasonText(message: string, analysis: Pick<CheckInAnalysis, 'regions'>): string {
  const againstStart = analysis.regions.length > 0 && analysis.regions.every((r) => r.painVsPrevious.reference === r.painVsBaseline.reference);
  return againstStart ? message.replace(/since the last check-in/g, 'since your starting point (before the plan)') : message;
}
