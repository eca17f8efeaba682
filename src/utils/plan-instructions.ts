import { PARAMETER_INFO } from '@shared/fit/setup';
import type { PlanStep } from '@shared/fit/planner';
import { formatLength, type LengthUnit } from '@shared/units';

/**
 * A length as the planner writes it in a step's instructions: "5 mm", "−30 mm", "172.5 mm"
 * (the shared instruction writer rounds to 0.1 mm and puts "−" before negative readings).
 */
const WRITTEN_LENGTH = /(−)?(\d+(?:\.\d+)?) mm\b/g;

const tenth = (v: number) => String(Math.round(Math.abs(v) * 10) / 10);

/**
 * The step's instruction lines in the viewer's unit. The stored lines are the server's words in
 * millimetres; for a rider who uses inches every length in them is rewritten in inches. A length
 * that is one of the step's own changes (amount, reading before or after) is converted from the
 * exact value rather than the rounded text, so the line agrees with the card above it to the last
 * digit. Angles are never converted.
 */
export function instructionLines(step: PlanStep, unit: LengthUnit): string[] {
  if (unit === 'mm') return step.instructions;
  const exact = new Map<string, number>();
  for (const c of step.changes) {
    if (PARAMETER_INFO[c.parameter].unit !== 'mm') continue;
    for (const v of [c.delta, c.from, c.to]) exact.set(tenth(v), Math.abs(v));
  }
  return step.instructions.map((line) =>
    line.replace(WRITTEN_LENGTH, (_match, minus: string | undefined, digits: string) => {
      const mm = exact.get(digits) ?? Number(digits);
      return `${minus ?? ''}${formatLength(mm, unit)}`;
    }),
  );
}
