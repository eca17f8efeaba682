/**
 * Saddle-height compensation carried by coupled groups (cranks, cleats). The compensation is
 * measured from a reference setup (the plan's baseline) so that the cleat rule, which depends
 * on the whole size of the move, is applied to the total cleat move, never step by step.
 */
import { ensureFinite, requireFinite } from '../errors';
import { cleatMoveCorrection } from '../saddle-height/corrections';
import type { Setup } from './schemas';

/**
 * The saddle-height offset (mm, + = up) that keeps leg reach constant for `setup` relative to
 * `reference`: cranks shorter by Δ → +Δ; stack thicker by Δ → +Δ (TRADE §2 [D]); cleat fore-aft
 * per cleatMoveCorrection (TRADE §4 [V2]).
 */
export function saddleOffsetFromReference(reference: Setup, setup: Setup): number {
  // Only these three values enter; a NaN among them must not become a NaN saddle move.
  for (const [name, s] of [['reference', reference], ['setup', setup]] as const) {
    requireFinite(`${name}.crankLength`, s.crankLength);
    requireFinite(`${name}.stack`, s.stack);
    requireFinite(`${name}.cleatForeAft`, s.cleatForeAft);
  }
  return (
    (reference.crankLength - setup.crankLength) +
    (setup.stack - reference.stack) +
    cleatMoveCorrection(setup.cleatForeAft - reference.cleatForeAft)
  );
}

/** The compensation a change from `from` to `to` carries, with the cleat rule anchored at `reference`. */
export function couplingCompensation(reference: Setup, from: Setup, to: Setup): number {
  return ensureFinite('saddleCompensation', saddleOffsetFromReference(reference, to) - saddleOffsetFromReference(reference, from));
}
