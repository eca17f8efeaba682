import { planSchema, type Plan as PlanBody, type PlanStep as PlanStepBody } from '@shared/fit/planner';
import { SETUP_PARAMETERS, type Setup } from '@shared/fit/setup';

/*
 * The fitter previews a plan in the browser with the same shared planner the server runs, so the
 * plan the server builds from its own inputs should match the preview exactly. A difference means
 * either the case changed since the preview (new pain, a check-in, physio limits, the date) or the
 * request was edited; either way the rider would get something the fitter did not review, so the
 * send is refused. The stored plan is always the server's own build, never the client's text.
 */

/** Both sides compute in IEEE doubles from the same JSON, so anything past this is a real difference. */
const TOLERANCE = 1e-6;

const near = (a: number, b: number) => Math.abs(a - b) <= TOLERANCE;
const sameSetup = (a: Setup, b: Setup) => SETUP_PARAMETERS.every((p) => near(a[p], b[p]));
const sameText = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((line, i) => line === b[i]);

function stepDifferences(sent: PlanStepBody, built: PlanStepBody): string[] {
  const n = built.index;
  const out: string[] = [];
  if (sent.kind !== built.kind || sent.group !== built.group) out.push(`step ${n} changes a different part of the bike`);
  const changesMatch =
    sent.changes.length === built.changes.length &&
    built.changes.every((c, i) => {
      const s = sent.changes[i]!;
      return s.parameter === c.parameter && s.coupledTo === c.coupledTo && near(s.from, c.from) && near(s.to, c.to) && near(s.delta, c.delta);
    });
  if (!changesMatch || !sameSetup(sent.setupAfter, built.setupAfter)) out.push(`step ${n} moves different amounts`);
  if (sent.earliestDate !== built.earliestDate || sent.checkInDue !== built.checkInDue) out.push(`step ${n} has different dates`);
  if (sent.minRides !== built.minRides) out.push(`step ${n} asks for a different number of rides`);
  if (!sameText(sent.instructions, built.instructions)) out.push(`step ${n} has different instructions`);
  return out;
}

/**
 * What differs between the plan the client sent and the plan the server built, in words a fitter
 * can act on (empty = the same plan). Call after `validatePlan`, which refuses a malformed body.
 */
export function planDifferences(sentRaw: unknown, built: PlanBody): string[] {
  const parsed = planSchema.safeParse(sentRaw);
  if (!parsed.success) return ['the plan is not well formed'];
  const sent = parsed.data;
  const out: string[] = [];
  if (sent.status !== built.status) out.push('the plan reaches a different end');
  if (sent.steps.length !== built.steps.length) out.push(`it has ${sent.steps.length} steps where the server plans ${built.steps.length}`);
  else built.steps.forEach((step, i) => out.push(...stepDifferences(sent.steps[i]!, step)));
  if (!sameSetup(sent.finalSetup, built.finalSetup)) out.push('it ends on a different setup');
  const limitKeys = ['windowDays', 'adaptationDays', 'adaptationRides', 'painFactor'] as const;
  // Caps of parameters neither plan moves cannot change the plan (a clinic may adjust its stem
  // cap while a saddle plan is previewed); the stored limits are the server's whole set anyway.
  const moved = new Set([...sent.steps, ...built.steps].flatMap((step) => step.changes.map((c) => c.parameter)));
  const limitsMatch =
    limitKeys.every((k) => near(sent.limits[k], built.limits[k])) &&
    [...moved].every((p) => near(sent.limits.stepCaps[p], built.limits.stepCaps[p]) && near(sent.limits.windowCaps[p], built.limits.windowCaps[p]));
  if (!limitsMatch) out.push('its caps or spacing differ');
  const reasonsMatch =
    sent.reasons.length === built.reasons.length &&
    built.reasons.every((r, i) => sent.reasons[i]!.code === r.code && sent.reasons[i]!.message === r.message && sent.reasons[i]!.parameters.join() === r.parameters.join());
  if (!reasonsMatch) out.push('its reasons differ');
  return out;
}
