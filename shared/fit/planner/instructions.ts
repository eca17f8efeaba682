/** Plain-language instructions for a step: what to change, by how much, how to measure it. */
import { requireFinite } from '../errors';
import { seatPostMove } from '../saddle-height/corrections';
import { PARAMETER_INFO, type ParameterGroup, type SetupParameter } from '../setup/parameters';
import type { Setup } from '../setup/schemas';
import type { PlanChange } from './schemas';

/** Amounts are shown to 0.1 mm or 0.1°, trailing zeros dropped. */
function amount(v: number, unit: 'mm' | 'deg'): string {
  const n = Math.round(Math.abs(v) * 10) / 10;
  return unit === 'mm' ? `${n} mm` : `${n}°`;
}

type Say = (amount: string) => string;

/** What to do, for a move up (+) and down (−) of each parameter. */
const VERBS: Record<SetupParameter, [up: Say, down: Say]> = {
  saddleHeight: [(a) => `Raise the saddle ${a}`, (a) => `Lower the saddle ${a}`],
  saddleSetback: [(a) => `Slide the saddle back ${a} on its rails`, (a) => `Slide the saddle forward ${a} on its rails`],
  saddleTilt: [(a) => `Tilt the saddle nose up ${a}`, (a) => `Tilt the saddle nose down ${a}`],
  reach: [(a) => `Lengthen the saddle-to-bar reach by ${a}`, (a) => `Shorten the saddle-to-bar reach by ${a}`],
  drop: [(a) => `Lower the bars ${a} (more drop)`, (a) => `Raise the bars ${a} (less drop)`],
  stemLength: [(a) => `Fit a stem ${a} longer`, (a) => `Fit a stem ${a} shorter`],
  spacerStack: [(a) => `Add ${a} of spacers under the stem`, (a) => `Move ${a} of spacers from under the stem to above it`],
  crankLength: [(a) => `Fit cranks ${a} longer`, (a) => `Fit cranks ${a} shorter`],
  stack: [(a) => `Raise the shoe and pedal stack by ${a} (for example a shim under the cleat)`, (a) => `Lower the shoe and pedal stack by ${a}`],
  cleatForeAft: [(a) => `Move the cleat ${a} toward the toe`, (a) => `Move the cleat ${a} toward the heel`],
  cleatRotation: [(a) => `Turn the cleat so the toes point ${a} further out`, (a) => `Turn the cleat so the toes point ${a} further in`],
};

/** A reading as the rider will see it on the tape or level, with its sign. */
function reading(v: number, unit: 'mm' | 'deg'): string {
  const text = amount(v, unit);
  return Math.round(v * 10) < 0 ? `−${text}` : text;
}

const COUPLING_WHY: Record<ParameterGroup, string> = {
  cranks: 'to keep the same leg reach with the new cranks',
  cleats: 'to keep the same leg reach after the shoe, pedal or cleat change',
  saddleHeight: '',
  saddleForeAft: '',
  saddleTilt: '',
  bars: '',
};

/** One sentence per change, then the common reminders. */
export function stepInstructions(changes: PlanChange[], before: Setup, after: Setup, seatTubeAngle?: number): string[] {
  const lines: string[] = [
    'Before you start, mark the seat post and note the current settings so you can always go back.',
  ];
  // The main change first, then the saddle compensation it carries.
  const ordered = [...changes.filter((c) => !c.coupledTo), ...changes.filter((c) => c.coupledTo)];
  for (const c of ordered) {
    // A NaN here would print "NaN mm" to a rider: refuse it instead.
    requireFinite(`changes.${c.parameter}.delta`, c.delta);
    requireFinite(`changes.${c.parameter}.to`, c.to);
    const info = PARAMETER_INFO[c.parameter];
    const [up, down] = VERBS[c.parameter];
    const why = c.coupledTo ? ` ${COUPLING_WHY[c.coupledTo]}` : '';
    lines.push(`${(c.delta > 0 ? up : down)(amount(c.delta, info.unit))}${why}: ${info.measure}. It should read ${reading(c.to, info.unit)}.`);
    if (c.parameter === 'saddleHeight' && seatTubeAngle !== undefined && after.saddleSetback === before.saddleSetback) {
      const slide = seatPostMove(c.delta, seatTubeAngle).setback;
      requireFinite('before.saddleSetback', before.saddleSetback);
      if (Math.abs(slide) >= 0.5) {
        lines.push(
          `Moving the seat post also moves the saddle ${slide > 0 ? 'back' : 'forward'} by ${amount(slide, 'mm')}; slide it ${slide > 0 ? 'forward' : 'back'} that much on its rails to keep the setback at ${amount(before.saddleSetback, 'mm')}.`,
        );
      }
    }
  }
  lines.push('Ride shorter and easier for the first few rides after a change, then log how it feels.');
  return lines;
}
