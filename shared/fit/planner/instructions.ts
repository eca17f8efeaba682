/** Plain-language instructions for a step: what to change, by how much, how to measure it. */
import { seatPostMove } from '../saddle-height/corrections';
import { PARAMETER_INFO, type ParameterGroup, type SetupParameter } from '../setup/parameters';
import type { Setup } from '../setup/schemas';
import type { PlanChange } from './schemas';

/** Amounts are shown to 0.1 mm or 0.1°, trailing zeros dropped. */
function amount(v: number, unit: 'mm' | 'deg'): string {
  const n = Math.round(Math.abs(v) * 10) / 10;
  return unit === 'mm' ? `${n} mm` : `${n}°`;
}

const VERBS: Record<SetupParameter, [up: string, down: string]> = {
  saddleHeight: ['Raise the saddle', 'Lower the saddle'],
  saddleSetback: ['Slide the saddle back on its rails', 'Slide the saddle forward on its rails'],
  saddleTilt: ['Tilt the saddle nose up', 'Tilt the saddle nose down'],
  reach: ['Lengthen the saddle-to-bar reach', 'Shorten the saddle-to-bar reach'],
  drop: ['Lower the bars (more drop)', 'Raise the bars (less drop)'],
  stemLength: ['Fit a longer stem, longer by', 'Fit a shorter stem, shorter by'],
  spacerStack: ['Add spacers under the stem:', 'Move spacers from under the stem to above it:'],
  crankLength: ['Fit longer cranks, longer by', 'Fit shorter cranks, shorter by'],
  stack: ['Raise the shoe and pedal stack (for example a shim under the cleat) by', 'Lower the shoe and pedal stack by'],
  cleatForeAft: ['Move the cleat toward the toe', 'Move the cleat toward the heel'],
  cleatRotation: ['Turn the cleat so the toes point further out by', 'Turn the cleat so the toes point further in by'],
};

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
  for (const c of changes) {
    const info = PARAMETER_INFO[c.parameter];
    const [up, down] = VERBS[c.parameter];
    const why = c.coupledTo ? ` ${COUPLING_WHY[c.coupledTo]}` : '';
    lines.push(
      `${c.delta > 0 ? up : down} ${amount(c.delta, info.unit)}${why}: ${info.measure}. It should read ${amount(c.to, info.unit).replace(/^/, c.to < 0 ? '−' : '')}.`,
    );
    if (c.parameter === 'saddleHeight' && seatTubeAngle !== undefined && after.saddleSetback === before.saddleSetback) {
      const slide = seatPostMove(c.delta, seatTubeAngle).setback;
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
