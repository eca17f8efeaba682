/**
 * Saddle-height corrections for changes elsewhere on the bike. Leg reach at the bottom of the
 * stroke ≈ saddle-to-BB + crank length − stack (TRADE §2 [D]); each correction keeps it constant.
 */
import { requireRange } from '../errors';
import { CLEAT_SMALL_MOVE_MM } from './constants';

const toRad = (deg: number) => (deg * Math.PI) / 180;

/**
 * Saddle-height change (mm, + = up) that keeps leg reach when cranks change length.
 * Shorter by Δ → saddle up Δ (TRADE §2 [D]; trade reports 175 → 170 mm, saddle +5 mm [V]).
 */
export function crankChangeCorrection(oldCrankMm: number, newCrankMm: number): number {
  requireRange('oldCrankLength', oldCrankMm, 100, 220, 'mm');
  requireRange('newCrankLength', newCrankMm, 100, 220, 'mm');
  return oldCrankMm - newCrankMm;
}

/** Saddle-height change (mm) for a shoe/pedal/cleat stack change: thicker by Δ → saddle up Δ (TRADE §2 [D]). */
export function stackChangeCorrection(oldStackMm: number, newStackMm: number): number {
  requireRange('oldStack', oldStackMm, 0, 80, 'mm');
  requireRange('newStack', newStackMm, 0, 80, 'mm');
  return newStackMm - oldStackMm;
}

/**
 * Saddle-height change (mm) for a cleat fore-aft move of `moveMm` (+ = toward the toe).
 * TRADE §4 [V2]: back 2–4 mm → saddle down the same; more → by half (back 10 → down 5).
 * Two decisions of ours, both [D]:
 * - a forward move is treated as the mirror image (saddle up), as the leg-reach argument is symmetric;
 * - above 4 mm the correction is half the move but never less than the 4 mm a 4 mm move already
 *   gets, so the correction never shrinks as the move grows (a literal "half" would give 4 mm → 4 mm
 *   but 5 mm → 2.5 mm). Moves under 2 mm are matched one-for-one like 2–4 mm.
 */
export function cleatMoveCorrection(moveMm: number): number {
  requireRange('cleatMove', moveMm, -80, 80, 'mm');
  const size = Math.abs(moveMm);
  const correction = size <= CLEAT_SMALL_MOVE_MM ? size : Math.max(CLEAT_SMALL_MOVE_MM, size / 2);
  return moveMm < 0 ? -correction : moveMm > 0 ? correction : 0;
}

export interface SeatPostMove {
  /** Change of saddle height along the seat tube (our saddle-height convention), mm. */
  alongSeatTube: number;
  /** Vertical rise of the saddle, mm. */
  vertical: number;
  /** Change of horizontal setback (+ = further behind the bottom bracket), mm. */
  setback: number;
}

/**
 * Sliding the saddle `alongMm` up the seat post (negative = down) at seat-tube angle `staDeg`
 * moves it up by d·sin(STA) and back by d·cos(STA) (TRADE §2 [D]): height and setback are coupled.
 * 10 mm at 73° → +9.6 mm vertical, +2.9 mm setback.
 */
export function seatPostMove(alongMm: number, staDeg: number): SeatPostMove {
  requireRange('alongSeatTube', alongMm, -300, 300, 'mm');
  requireRange('seatTubeAngle', staDeg, 60, 90, '°');
  return {
    alongSeatTube: alongMm,
    vertical: alongMm * Math.sin(toRad(staDeg)),
    setback: alongMm * Math.cos(toRad(staDeg)),
  };
}

/**
 * The seat-post move that raises the saddle top by `verticalMm`, with the setback change it brings:
 * d = vertical / sin(STA) (TRADE §2 [D]).
 */
export function seatPostMoveForVertical(verticalMm: number, staDeg: number): SeatPostMove {
  requireRange('vertical', verticalMm, -300, 300, 'mm');
  requireRange('seatTubeAngle', staDeg, 60, 90, '°');
  return seatPostMove(verticalMm / Math.sin(toRad(staDeg)), staDeg);
}

/**
 * Rail slide needed to keep the setback unchanged after a seat-post move of `alongMm`
 * (+ = slide the saddle forward on its rails). Sliding on the rails is horizontal and leaves
 * the along-the-tube height unchanged for a level saddle, so it undoes only the setback part [D].
 */
export function railSlideToKeepSetback(alongMm: number, staDeg: number): number {
  return seatPostMove(alongMm, staDeg).setback;
}
