/** Clinically meaningful change on 0–10 scales. */
import { requireRange } from '../errors';
import type { Change, ChangeCategory } from './schemas';

/**
 * A change of at least 2 points, or about 30 %, is clinically meaningful ("much better" /
 * "much worse"). Salaffi et al. 2004, Eur J Pain 8(4):283–291 [V]; Farrar et al. 2001 [M].
 */
export const MEANINGFUL_CHANGE = { points: 2, fraction: 0.3 } as const;

/**
 * Compares two scores. `higherIsWorse` is true for pain and false for comfort. Either rule
 * counts: |Δ| ≥ 2 points, or |Δ| / reference ≥ 30 % when the reference is above 0 (on whole-number
 * scores that makes a 1-point change meaningful only from a reference of 3 or less). The same
 * thresholds are applied to comfort, a 0–10 scale of the same shape [D].
 */
export function compareScores(reference: number, current: number, higherIsWorse = true): Change {
  // Both scales run 0–10; anything else is a mistake, never a score to compare.
  requireRange('reference', reference, 0, 10);
  requireRange('current', current, 0, 10);
  const delta = current - reference;
  const relative = reference > 0 ? delta / reference : null;
  const size = Math.abs(delta);
  const much = size >= MEANINGFUL_CHANGE.points || (relative !== null && size > 0 && Math.abs(relative) >= MEANINGFUL_CHANGE.fraction - 1e-9);
  let category: ChangeCategory = 'same';
  if (delta !== 0) {
    const worse = higherIsWorse ? delta > 0 : delta < 0;
    category = worse ? (much ? 'much-worse' : 'worse') : much ? 'much-better' : 'better';
  }
  return { reference, current, delta, relative, category };
}
