import { clinicSettingsSchema, type ClinicSettings, type ClinicSettingsInput } from '@shared/clinic';
import { fromMinorUnits, toMinorUnits, type Currency } from '@shared/booking';
import { FitInputError } from '@shared/fit/errors';
import { checkPolicy, type Policy } from '@shared/fit/planner';
import { PARAMETER_INFO, type SetupParameter } from '@shared/fit/setup';
import type { HardBounds } from '@/api/admin';

/*
 * The Clinic policy form and its conversion to and from the API. People think of the fee in the
 * currency's major unit and of refund shares as percentages; the API wants minor units and 0–1.
 * Field keys are the API's dotted paths (`planner.stepCaps.saddleHeight`), so a message from our
 * own check and one from the server land beside the same input.
 */

export interface PolicyForm {
  /** Major units (euros, yen); null while the field is empty. */
  fee: number | null;
  currency: Currency;
  windowHours: number | null;
  earlyPercent: number | null;
  latePercent: number | null;
  holdMinutes: number | null;
  planner: Policy;
}

export const FEE_FIELD = 'defaultFeeMinor';

export function formFromSettings(s: ClinicSettings): PolicyForm {
  return {
    fee: fromMinorUnits(s.defaultFeeMinor, s.currency),
    currency: s.currency,
    windowHours: s.cancellation.windowHours,
    earlyPercent: Math.round(s.cancellation.earlyRefundShare * 100),
    latePercent: Math.round(s.cancellation.lateRefundShare * 100),
    holdMinutes: s.holdMinutes,
    planner: { ...s.planner, stepCaps: { ...s.planner.stepCaps }, windowCaps: { ...s.planner.windowCaps } },
  };
}

/** An empty field becomes NaN, so the shared schema reports it on that field. */
const num = (value: number | null): number => (value === null ? Number.NaN : value);

export function settingsFromForm(f: PolicyForm): ClinicSettingsInput {
  return {
    defaultFeeMinor: f.fee === null ? Number.NaN : toMinorUnits(f.fee, f.currency),
    currency: f.currency,
    cancellation: {
      windowHours: num(f.windowHours),
      earlyRefundShare: f.earlyPercent === null ? Number.NaN : f.earlyPercent / 100,
      lateRefundShare: f.latePercent === null ? Number.NaN : f.latePercent / 100,
    },
    holdMinutes: num(f.holdMinutes),
    planner: f.planner,
  };
}

const EMPTY_MESSAGES: Record<string, string> = {
  [FEE_FIELD]: 'Enter the default fee for one session.',
  'cancellation.windowHours': 'Enter the number of hours.',
  'cancellation.earlyRefundShare': 'Enter a percentage from 0 to 100.',
  'cancellation.lateRefundShare': 'Enter a percentage from 0 to 100.',
  holdMinutes: 'Enter the minutes a slot stays held.',
};

/** "1–5 mm", "0.5–2°", "7–42 days". */
export function rangeText(bounds: readonly [number, number], unit: string): string {
  const tail = unit === '°' ? '°' : ` ${unit}`;
  return `${bounds[0]}–${bounds[1]}${tail}`;
}

export const unitOf = (parameter: SetupParameter): string => (PARAMETER_INFO[parameter].unit === 'deg' ? '°' : 'mm');

/** A plain sentence for a value outside its hard bound, e.g. for `planner.stepCaps.saddleHeight`. */
export function boundMessage(what: string, value: number, bounds: readonly [number, number], unit: string, safety = true): string {
  const tail = safety ? ' The hard safety bounds cannot be changed here.' : '';
  return `${value} is outside the allowed ${rangeText(bounds, unit)} for ${what}.${tail}`;
}

/** Label, unit and hard bounds of each planner field, by its dotted path. */
export function plannerFieldInfo(bounds: HardBounds): Record<string, { what: string; unit: string; bounds: readonly [number, number] }> {
  const out: Record<string, { what: string; unit: string; bounds: readonly [number, number] }> = {};
  for (const [p, b] of Object.entries(bounds.stepCaps) as [SetupParameter, [number, number]][]) {
    out[`planner.stepCaps.${p}`] = { what: `the ${PARAMETER_INFO[p].label} step cap`, unit: unitOf(p), bounds: b };
  }
  for (const [p, b] of Object.entries(bounds.windowCaps) as [SetupParameter, [number, number]][]) {
    out[`planner.windowCaps.${p}`] = { what: `the ${PARAMETER_INFO[p].label} window cap`, unit: unitOf(p), bounds: b };
  }
  out['planner.windowDays'] = { what: 'the window', unit: 'days', bounds: bounds.windowDays };
  out['planner.adaptationDays'] = { what: 'the adaptation days', unit: 'days', bounds: bounds.adaptationDays };
  out['planner.adaptationRides'] = { what: 'the adaptation rides', unit: 'rides', bounds: bounds.adaptationRides };
  out['planner.revertRecencyDays'] = { what: 'a one-step revert', unit: 'days', bounds: bounds.revertRecencyDays };
  return out;
}

/**
 * Every problem with the form before it is sent: the clinic settings schema (types, empty fields,
 * plausibility) and then `checkPolicy` against the hard safety bounds. Empty means "send it".
 */
export function checkPolicyForm(f: PolicyForm, bounds: HardBounds): Record<string, string> {
  const input = settingsFromForm(f);
  const errors: Record<string, string> = {};
  const parsed = clinicSettingsSchema.safeParse(input);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const key = issue.path.map(String).join('.');
      errors[key] ??= EMPTY_MESSAGES[key] && Number.isNaN(valueAt(input, key)) ? EMPTY_MESSAGES[key] : issue.message;
    }
    return errors;
  }
  const info = plannerFieldInfo(bounds);
  try {
    for (const issue of checkPolicy(parsed.data.planner)) {
      const key = `planner.${issue.field}`;
      const field = info[key];
      errors[key] ??= field ? boundMessage(field.what, issue.value, [issue.min, issue.max], field.unit) : issue.message;
    }
  } catch (caught) {
    if (!(caught instanceof FitInputError)) throw caught;
    errors[`planner.${caught.field}`] = caught.message;
  }
  // The server sends its own bounds; hold the form to them too, should they ever be tighter.
  for (const [key, field] of Object.entries(info)) {
    const value = valueAt(input, key);
    if (errors[key] === undefined && (value < field.bounds[0] || value > field.bounds[1])) errors[key] = boundMessage(field.what, value, field.bounds, field.unit);
  }
  return errors;
}

function valueAt(root: unknown, path: string): number {
  let node: unknown = root;
  for (const part of path.split('.')) node = node && typeof node === 'object' ? (node as Record<string, unknown>)[part] : undefined;
  return typeof node === 'number' ? node : Number.NaN;
}
