import { GROUP_LABELS, PARAMETER_INFO, type SetupParameter } from '@shared/fit/setup';
import type { PlanChange, PlanStep } from '@shared/fit/planner';
import { formatSignedLength, type LengthUnit } from '@shared/units';
import { formatMeasure } from '@/utils/measure';

/** "+3 mm", "−0.12 in", "+1°": a change with its sign, in the viewer's unit. */
export function formatDelta(parameter: SetupParameter, delta: number, unit: LengthUnit): string {
  if (PARAMETER_INFO[parameter].unit === 'deg') {
    const n = Math.round(Math.abs(delta) * 10) / 10;
    return `${delta > 0 ? '+' : delta < 0 ? '−' : '±'}${n}°`;
  }
  return formatSignedLength(delta, unit);
}

export function formatValue(parameter: SetupParameter, value: number, unit: LengthUnit): string {
  return formatMeasure(value, PARAMETER_INFO[parameter].unit, unit);
}

/** The change the step is about (not the saddle compensation it carries). */
export function mainChange(step: PlanStep): PlanChange | undefined {
  return step.changes.find((c) => c.coupledTo === null) ?? step.changes[0];
}

/** "Saddle height" for a step's heading; a revert says so. */
export function stepTitle(step: PlanStep): string {
  if (step.kind === 'revert') return 'Back to an earlier setup';
  const label = step.group ? GROUP_LABELS[step.group] : mainChange(step) ? PARAMETER_INFO[mainChange(step)!.parameter].label : 'Change';
  return label.charAt(0).toUpperCase() + label.slice(1);
}

/** One line for a card: "saddle height +3 mm (752 → 755 mm)". */
export function changeLine(change: PlanChange, unit: LengthUnit): string {
  return `${PARAMETER_INFO[change.parameter].label} ${formatDelta(change.parameter, change.delta, unit)} (${formatValue(change.parameter, change.from, unit)} → ${formatValue(change.parameter, change.to, unit)})`;
}

/** Today as YYYY-MM-DD in the viewer's own calendar. */
export function todayIso(): string {
  const now = new Date();
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

/** "Tue 9 Mar 2027" for an ISO date, read as a calendar date (no time-zone shift). */
export function formatIsoDate(iso: string): string {
  const date = new Date(`${iso}T12:00:00Z`);
  if (Number.isNaN(date.getTime())) return iso;
  return new Intl.DateTimeFormat(undefined, { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(date);
}
