/** Check-in analysis: per-region trend against the baseline and the previous check-in, and what happens next. */
import { parseInput } from '../errors';
import { maxReferral, screenRedFlags } from '../triage/red-flags';
import type { BodyRegion } from '../triage/regions';
import type { ReferralLevel } from '../triage/schemas';
import { compareScores } from './compare';
import {
  checkInAnalysisInputSchema,
  type CheckIn,
  type CheckInAnalysis,
  type CheckInAnalysisInput,
  type CheckInDecision,
} from './schemas';

type Reason = CheckInAnalysis['reasons'][number];

/**
 * Overall comfort at or below this asks for the fitter's look even with no pain marked and no
 * earlier score to compare with (our decision: a rider who rates the bike 3/10 or less is not
 * ready for another change, whatever the trend).
 */
export const LOW_COMFORT = 3;

function regionMap(c: CheckIn) {
  return new Map(c.regions.map((r) => [r.region, r] as const));
}

/** Pain in a region at a check-in; a region not reported there is taken as pain-free (a new symptom is compared with 0). */
function painAt(c: CheckIn, region: BodyRegion): number {
  return regionMap(c).get(region)?.pain ?? 0;
}

function muchWorseVs(reference: CheckIn, current: CheckIn, region: BodyRegion): boolean {
  if (!regionMap(current).has(region)) return false;
  return compareScores(painAt(reference, region), painAt(current, region)).category === 'much-worse';
}

/**
 * Analyses a check-in. Decision, in order of precedence:
 * 1. refer — any red flag (level from screenRedFlags; urgent stays urgent), or repeated worsening:
 *    the same region much worse than the check-in before in two check-ins in a row, or much
 *    worse than the baseline in two check-ins in a row (TRADE §6: pain that has not settled
 *    after changes → physio, at least routine);
 * 2. suggest-revert — a region much worse than at the previous check-in (or the baseline, on the first);
 * 3. hold-for-review — a region a little worse than last time, much worse than the baseline,
 *    comfort (a region's or overall) much worse than last time, overall comfort at LOW_COMFORT or
 *    below, new numbness or tingling (common practice: numbness points to pressure on a nerve, which
 *    a fitter should look at before the next change), or fewer rides than the step asks for;
 * 4. continue — everything the same or better: the next step is unlocked.
 */
export function analyseCheckIn(input: CheckInAnalysisInput): CheckInAnalysis {
  const p = parseInput(checkInAnalysisInputSchema, input, 'checkIn');
  const chain = [p.baseline, ...p.previous];
  const previous = chain[chain.length - 1] as CheckIn;
  const beforePrevious = chain.length >= 2 ? (chain[chain.length - 2] as CheckIn) : null;
  const baseMap = regionMap(p.baseline);
  const prevMap = regionMap(previous);
  const reasons: Reason[] = [];

  const regions = p.current.regions.map((r) => {
    const b = baseMap.get(r.region);
    const v = prevMap.get(r.region);
    return {
      region: r.region,
      painVsBaseline: compareScores(b?.pain ?? 0, r.pain),
      painVsPrevious: compareScores(v?.pain ?? 0, r.pain),
      comfortVsBaseline: r.comfort !== undefined && b?.comfort !== undefined ? compareScores(b.comfort, r.comfort, false) : null,
      comfortVsPrevious: r.comfort !== undefined && v?.comfort !== undefined ? compareScores(v.comfort, r.comfort, false) : null,
    };
  });

  const lastComfort = [...chain].reverse().find((c) => c.comfort !== undefined)?.comfort;
  const comfortVsPrevious = p.current.comfort !== undefined && lastComfort !== undefined ? compareScores(lastComfort, p.current.comfort, false) : null;
  // On the first check-in the comparison is with the starting point (the intake), not a check-in.
  const since = p.previous.length > 0 ? 'since the last check-in' : 'since your starting point (before the plan)';
  const numbnessIsNew = p.current.numbness === true && previous.numbness !== true;

  const flags = screenRedFlags({ answers: p.current.redFlagAnswers ?? {}, symptoms: p.current.symptoms ?? [], age: p.age });
  let referral: ReferralLevel = flags.level;
  for (const t of flags.triggers) reasons.push({ code: `red-flag:${t.id}`, message: t.reason });
  // A pain score of 7+ in the check-in itself is a red flag too (TRADE §6).
  const severe = regions.filter((r) => r.painVsBaseline.current >= 7);
  if (severe.length > 0 && !flags.triggers.some((t) => t.id === 'severe-pain')) {
    referral = maxReferral(referral, 'physio-soon');
    reasons.push({ code: 'red-flag:severe-pain', message: `Pain of 7 or more out of 10 (${severe.map((r) => r.region).join(', ')}).` });
  }

  const muchWorseNow = regions.filter((r) => r.painVsPrevious.category === 'much-worse').map((r) => r.region);
  const repeated = beforePrevious
    ? regions
        .map((r) => r.region)
        .filter(
          (region) =>
            (muchWorseNow.includes(region) && muchWorseVs(beforePrevious, previous, region)) ||
            (muchWorseVs(p.baseline, p.current, region) && p.previous.length > 0 && muchWorseVs(p.baseline, previous, region)),
        )
    : [];
  if (repeated.length > 0) {
    referral = maxReferral(referral, 'physio-routine');
    reasons.push({ code: 'repeated-worsening', message: `Much worse at two check-ins in a row: ${repeated.join(', ')}.` });
  }

  let decision: CheckInDecision;
  if (referral !== 'none') {
    decision = 'refer';
  } else if (muchWorseNow.length > 0) {
    decision = 'suggest-revert';
    reasons.push({ code: 'much-worse-since-last-step', message: `Much worse ${since} (2+ points or 30 %): ${muchWorseNow.join(', ')}. Going back to the previous setup is suggested.` });
  } else {
    const hold: Reason[] = [];
    const worse = regions.filter((r) => r.painVsPrevious.category === 'worse').map((r) => r.region);
    if (worse.length > 0) hold.push({ code: 'a-little-worse', message: `A little worse ${since}: ${worse.join(', ')}.` });
    const vsBase = regions.filter((r) => r.painVsBaseline.category === 'much-worse').map((r) => r.region);
    if (vsBase.length > 0) hold.push({ code: 'much-worse-than-baseline', message: `Much worse than before the plan started: ${vsBase.join(', ')}.` });
    const comfort = regions
      .filter((r) => r.comfortVsPrevious?.category === 'much-worse' || r.comfortVsBaseline?.category === 'much-worse')
      .map((r) => r.region);
    if (comfort.length > 0) hold.push({ code: 'comfort-much-worse', message: `Comfort much worse: ${comfort.join(', ')}.` });
    if (comfortVsPrevious?.category === 'much-worse') {
      hold.push({ code: 'overall-comfort-much-worse', message: `Comfort on the bike is much worse than last time (${comfortVsPrevious.reference} → ${comfortVsPrevious.current} out of 10).` });
    } else if (p.current.comfort !== undefined && p.current.comfort <= LOW_COMFORT) {
      hold.push({ code: 'low-comfort', message: `Comfort on the bike is low (${p.current.comfort} out of 10): your fitter will look before the next change.` });
    }
    if (numbnessIsNew) hold.push({ code: 'new-numbness', message: 'Numbness or tingling on the rides: your fitter will look before the next change.' });
    if (p.minRides !== undefined && (p.current.rides ?? 0) < p.minRides) {
      hold.push({ code: 'not-enough-rides', message: `Ride at least ${p.minRides} times on this step before the next one (${p.current.rides ?? 0} so far).` });
    }
    reasons.push(...hold);
    decision = hold.length > 0 ? 'hold-for-review' : 'continue';
    if (decision === 'continue') reasons.push({ code: 'steady-or-better', message: 'The same or better everywhere: the next step is unlocked.' });
  }
  return { decision, referralLevel: referral, reasons, regions, comfortVsPrevious };
}
