/**
 * Symptom → possible fit causes to check, for the fitter. Suggestions with sources, never a
 * diagnosis. Table: Silberman, Webner, Collina & Shiple 2005, Clin J Sport Med 15(4):271–276 [V];
 * Asplund & St Pierre 2004, Phys Sportsmed 32(4):23–30 [V]; rows with their own source say so.
 */
import { z } from 'zod';
import type { SetupParameter } from '../setup/parameters';
import { parseInput } from '../errors';
import type { BodyRegion } from './regions';
import { bodyRegionSchema, symptomSchema, type Symptom, type SymptomInput } from './schemas';
import { setupParameterSchema } from '../setup/schemas';

export const FIT_CAUSES = {
  'saddle-low': { text: 'Saddle may be too low', parameters: ['saddleHeight'] },
  'saddle-high': { text: 'Saddle may be too high', parameters: ['saddleHeight'] },
  'saddle-forward': { text: 'Saddle may be too far forward', parameters: ['saddleSetback'] },
  'saddle-back': { text: 'Saddle may be too far back', parameters: ['saddleSetback'] },
  'saddle-angle': { text: 'Saddle tilt may be off', parameters: ['saddleTilt'] },
  'saddle-nose-down': { text: 'Saddle nose may point down too much', parameters: ['saddleTilt'] },
  'saddle-pressure': { text: 'Saddle pressure and tilt may need attention', parameters: ['saddleTilt'] },
  'hip-rocking': { text: 'Check whether the hips rock on the saddle', parameters: ['saddleHeight'] },
  'big-gears': { text: 'Pushing big gears at low cadence', parameters: [] },
  'long-cranks': { text: 'Cranks may be too long', parameters: ['crankLength'] },
  'excess-float': { text: 'Pedal float may be too loose', parameters: ['cleatRotation'] },
  'toes-out': { text: 'Toes may point out (cleat rotation)', parameters: ['cleatRotation'] },
  'toes-in': { text: 'Toes may point in (cleat rotation)', parameters: ['cleatRotation'] },
  'leg-length-difference': { text: 'A leg-length difference may need a shim', parameters: ['stack'] },
  'reach-long': { text: 'Reach to the bars may be too long', parameters: ['reach', 'stemLength'] },
  'reach-short': { text: 'Reach to the bars may be too short', parameters: ['reach', 'stemLength'] },
  'bars-low': { text: 'Bars may be too low', parameters: ['drop', 'spacerStack'] },
  'stem-long': { text: 'Stem may be too long', parameters: ['stemLength'] },
  'tight-shoes': { text: 'Shoes may be too tight', parameters: [] },
  'cleat-forward': { text: 'Cleat may be too far forward', parameters: ['cleatForeAft'] },
  ankling: { text: 'Ankling (heavy toe-down pedalling)', parameters: [] },
} as const satisfies Record<string, { text: string; parameters: readonly SetupParameter[] }>;
export type FitCause = keyof typeof FIT_CAUSES;

interface CauseRow {
  label: string;
  causes: readonly FitCause[];
  source: string;
  /** Kinds of pain that fit this row especially well (scored higher). */
  kinds?: readonly Symptom['kind'][];
}

const SILBERMAN = 'Silberman et al. 2005, Clin J Sport Med 15(4):271–276 [V]';

/** TRADE §5: each symptom row with the causes its sources cite. */
export const CAUSE_TABLE = {
  'anterior-knee': { label: 'front of knee', causes: ['saddle-low', 'saddle-forward', 'big-gears', 'long-cranks'], source: SILBERMAN },
  'posterior-knee': { label: 'back of knee', causes: ['saddle-high', 'saddle-back', 'excess-float'], source: SILBERMAN },
  'medial-knee': { label: 'inner knee', causes: ['toes-out', 'excess-float'], source: SILBERMAN },
  'lateral-knee': { label: 'outer knee (ITB)', causes: ['toes-in', 'saddle-high', 'leg-length-difference'], source: SILBERMAN },
  // An observation the fitter makes on video, not a place that hurts; kept as TRADE lists it.
  'hip-rocking': { label: 'hips rocking on the saddle (observed)', causes: ['saddle-high', 'leg-length-difference'], source: SILBERMAN },
  // Hip pain has no row in TRADE §5. Ours: look for the rocking the row above explains, and for a
  // closed hip angle from a low front end [from memory]. Weaker evidence than the sourced rows.
  'hip-pain': { label: 'hip', causes: ['hip-rocking', 'saddle-high', 'leg-length-difference', 'bars-low'], source: `check for hip rocking: ${SILBERMAN}; hip pain itself is not in TRADE §5, the link and the low front end are [from memory]` },
  'low-back': { label: 'lower back', causes: ['reach-long', 'bars-low', 'reach-short', 'hip-rocking', 'saddle-angle'], source: `${SILBERMAN}; Asplund & St Pierre 2004 [V]; saddle tilt: Salai et al. 1999, Br J Sports Med 33(6):398–400 [V]` },
  'neck-shoulders': { label: 'neck and shoulders', causes: ['reach-long', 'bars-low', 'saddle-nose-down'], source: SILBERMAN },
  'hand-numbness': { label: 'hands', causes: ['bars-low', 'saddle-forward', 'saddle-nose-down', 'stem-long'], source: `${SILBERMAN}; Patterson et al. 2003, Am J Sports Med 31(4) [V]`, kinds: ['numb', 'tingling'] },
  'hot-foot': { label: 'foot (hot foot)', causes: ['tight-shoes', 'cleat-forward'], source: SILBERMAN, kinds: ['burning', 'numb', 'tingling'] },
  'perineal-numbness': { label: 'saddle area', causes: ['saddle-pressure'], source: 'Lowe et al. 2004, Med Sci Sports Exerc 36(6) [V]', kinds: ['numb', 'tingling'] },
  achilles: { label: 'Achilles', causes: ['saddle-high', 'cleat-forward', 'ankling'], source: 'Silberman et al. 2005, as quoted [V2]' },
} as const satisfies Record<string, CauseRow>;
export type CauseRowId = keyof typeof CAUSE_TABLE;

/** Which table row a body region reads from; regions without a sourced row have none. */
export function causeRowFor(region: BodyRegion): CauseRowId | null {
  if (region.startsWith('knee-front')) return 'anterior-knee';
  if (region.startsWith('knee-back')) return 'posterior-knee';
  if (region.startsWith('knee-inner')) return 'medial-knee';
  if (region.startsWith('knee-outer')) return 'lateral-knee';
  if (region.startsWith('hip-')) return 'hip-pain';
  if (region === 'lower-back') return 'low-back';
  if (region === 'neck' || region.startsWith('shoulder-')) return 'neck-shoulders';
  if (region.startsWith('hand-')) return 'hand-numbness';
  if (region.startsWith('foot-')) return 'hot-foot';
  if (region === 'perineum') return 'perineal-numbness';
  if (region.startsWith('achilles-')) return 'achilles';
  return null;
}

/**
 * Ranking weights (the sizes are our decision; the directions are sourced or common practice):
 * - KIND_MATCH_BONUS: the kind of symptom is typical of the row, e.g. numbness in the hands
 *   (Patterson et al. 2003 [V]), the saddle area (Lowe et al. 2004 [V]) or the feet (hot foot:
 *   tight shoes, cleat forward, Silberman 2005 [V]). The `numbness` flag counts like a numb kind:
 *   numbness points to pressure at a contact point, which those rows name.
 * - DURING_RIDE_BONUS: it hurts while riding, i.e. under the position's load (common practice [CP]);
 *   pain only after rides still counts, without the bonus (overuse builds up, Asplund 2004 [V]).
 * - PERSISTENT_BONUS: it has gone on for at least PERSISTENT_DAYS (one default adaptation period,
 *   our decision): a symptom that keeps coming back over weeks of riding points to the set-up
 *   more than a one-off ride does [CP].
 * - OFF_BIKE_FACTOR: it hurts only at rest or at night, never on or after a ride: less likely a fit
 *   cause (and a red flag for the physio, TRADE §6 [V]), so its weight is halved.
 */
const KIND_MATCH_BONUS = 2;
const DURING_RIDE_BONUS = 1;
const PERSISTENT_BONUS = 1;
const PERSISTENT_DAYS = 14;
const OFF_BIKE_FACTOR = 0.5;

/** How strongly one symptom points to the causes its row cites (see the weights above). */
function symptomWeight(s: Symptom, row: CauseRow): number {
  const numb = s.numbness && row.kinds?.includes('numb');
  let weight = Math.max(1, s.pain) + (row.kinds?.includes(s.kind) || numb ? KIND_MATCH_BONUS : 0);
  if (s.timing.includes('during-ride')) weight += DURING_RIDE_BONUS;
  if (s.durationDays >= PERSISTENT_DAYS) weight += PERSISTENT_BONUS;
  const ridingRelated = s.timing.includes('during-ride') || s.timing.includes('after-ride');
  return ridingRelated ? weight : weight * OFF_BIKE_FACTOR;
}

/** One ranked possible fit cause, as sent to the fitter's screen. */
export const rankedCauseSchema = z.object({
  cause: z.enum(Object.keys(FIT_CAUSES) as [FitCause, ...FitCause[]]),
  /** "Possible fit cause to check": plain words for the fitter. */
  text: z.string(),
  parameters: z.array(setupParameterSchema),
  score: z.number(),
  regions: z.array(bodyRegionSchema),
  rows: z.array(z.enum(Object.keys(CAUSE_TABLE) as [CauseRowId, ...CauseRowId[]])),
  sources: z.array(z.string()),
});
export type RankedCause = z.infer<typeof rankedCauseSchema>;

/**
 * Possible fit causes to check, ranked, for the fitter. Each symptom adds its weight to every
 * cause its row cites: its pain score (at least 1, so a painless numbness still counts), plus
 * bonuses for a kind typical of the row (or numbness where the row names it), pain while riding
 * and a symptom that has lasted weeks, halved when it hurts only off the bike (symptomWeight).
 * Causes cited by several symptoms rise. Ties keep the order in which the symptoms and the table
 * list them. Never a diagnosis.
 */
export function rankFitCauses(symptoms: SymptomInput[]): RankedCause[] {
  const list = parseInput(z.array(symptomSchema).max(60), symptoms, 'symptoms');
  const byCause = new Map<FitCause, RankedCause>();
  for (const s of list) {
    const rowId = causeRowFor(s.region);
    if (!rowId) continue;
    const row: CauseRow = CAUSE_TABLE[rowId];
    const weight = symptomWeight(s, row);
    for (const cause of row.causes) {
      const entry = byCause.get(cause) ?? {
        cause,
        text: FIT_CAUSES[cause].text,
        parameters: [...FIT_CAUSES[cause].parameters],
        score: 0,
        regions: [],
        rows: [],
        sources: [],
      };
      entry.score += weight;
      if (!entry.regions.includes(s.region)) entry.regions.push(s.region);
      if (!entry.rows.includes(rowId)) entry.rows.push(rowId);
      if (!entry.sources.includes(row.source)) entry.sources.push(row.source);
      byCause.set(cause, entry);
    }
  }
  // Array sort is stable: ties keep the order in which the symptoms and their sources list them.
  return [...byCause.values()].sort((a, b) => b.score - a.score);
}
