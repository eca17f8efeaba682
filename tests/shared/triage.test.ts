import { describe, expect, it } from 'vitest';
import { FitInputError } from '@shared/fit/errors';
import {
  BODY_REGIONS,
  CAUSE_TABLE,
  causeRowFor,
  CAUTIONS,
  maxReferral,
  RED_FLAG_QUESTIONS,
  rankFitCauses,
  REFERRAL_ADVICE,
  REGION_INFO,
  screenRedFlags,
  type SymptomInput,
} from '@shared/fit/triage';

const symptom = (over: Partial<SymptomInput>): SymptomInput => ({
  region: 'knee-front-left', pain: 3, kind: 'ache', timing: ['during-ride'], durationDays: 14, ...over,
});

describe('body regions', () => {
  it('have a label, a view and a side for the body map', () => {
    for (const r of BODY_REGIONS) {
      expect(REGION_INFO[r].label.length).toBeGreaterThan(2);
      expect(['front', 'back', 'both']).toContain(REGION_INFO[r].view);
    }
    expect(REGION_INFO['knee-outer-right']).toMatchObject({ side: 'right', view: 'front' });
  });
});

describe('possible fit causes (Silberman et al. 2005 [V]; Asplund & St Pierre 2004 [V])', () => {
  it('maps each region with a TRADE §5 row to it', () => {
    expect(causeRowFor('knee-front-right')).toBe('anterior-knee');
    expect(causeRowFor('knee-back-left')).toBe('posterior-knee');
    expect(causeRowFor('knee-inner-left')).toBe('medial-knee');
    expect(causeRowFor('knee-outer-left')).toBe('lateral-knee');
    // Hip pain has its own row: hip rocking is something the fitter sees, not a place that hurts.
    expect(causeRowFor('hip-left')).toBe('hip-pain');
    expect(causeRowFor('lower-back')).toBe('low-back');
    expect(causeRowFor('neck')).toBe('neck-shoulders');
    expect(causeRowFor('shoulder-right')).toBe('neck-shoulders');
    expect(causeRowFor('hand-left')).toBe('hand-numbness');
    expect(causeRowFor('foot-right')).toBe('hot-foot');
    expect(causeRowFor('perineum')).toBe('perineal-numbness');
    expect(causeRowFor('achilles-left')).toBe('achilles');
    expect(causeRowFor('calf-left')).toBeNull();
  });

  it('lists the causes TRADE §5 cites for anterior knee pain: saddle low or forward, big gears, long cranks (Silberman et al. 2005 [V])', () => {
    expect(rankFitCauses([symptom({})]).map((c) => c.cause)).toEqual(['saddle-low', 'saddle-forward', 'big-gears', 'long-cranks']);
  });

  it('ranks a cause cited by several symptoms first: saddle high for back-of-knee, outer-knee and Achilles pain', () => {
    const ranked = rankFitCauses([
      symptom({ region: 'knee-back-left', pain: 4 }),
      symptom({ region: 'knee-outer-left', pain: 4 }),
      symptom({ region: 'achilles-left', pain: 3 }),
      symptom({ region: 'neck', pain: 5 }),
    ]);
    expect(ranked[0]?.cause).toBe('saddle-high');
    // Each: pain + 1 while riding + 1 for lasting 14 days or more: (4+2) + (4+2) + (3+2).
    expect(ranked[0]?.score).toBe(17);
    expect(ranked[0]?.regions).toEqual(['knee-back-left', 'knee-outer-left', 'achilles-left']);
    expect(ranked[0]?.sources.length).toBe(2);
  });

  it('weights numbness in the hands (Patterson et al. 2003 [V]) and saddle area (Lowe et al. 2004 [V])', () => {
    const ranked = rankFitCauses([symptom({ region: 'hand-left', pain: 0, kind: 'numb' }), symptom({ region: 'perineum', pain: 0, kind: 'ache' })]);
    expect(ranked[0]?.cause).toBe('bars-low');
    expect(ranked[0]?.score).toBe(5); // 1 + 2 (numb) + 1 (while riding) + 1 (14 days)
    expect(ranked.find((c) => c.cause === 'saddle-pressure')?.score).toBe(3);
    // The numbness flag counts like a numb kind where the row names numbness (feet: tight shoes, cleat; Silberman 2005 [V]).
    const foot = rankFitCauses([symptom({ region: 'foot-left', pain: 2, kind: 'ache', numbness: true })]);
    expect(foot.map((c) => [c.cause, c.score])).toEqual([['tight-shoes', 6], ['cleat-forward', 6]]);
    const knee = rankFitCauses([symptom({ pain: 2, numbness: true })]);
    expect(knee[0]?.score).toBe(4);
    expect(CAUSE_TABLE['hand-numbness'].source).toContain('Patterson');
    expect(CAUSE_TABLE['perineal-numbness'].source).toContain('Lowe');
  });

  it('ranks pain while riding and lasting pain above a one-off after a ride, and halves pain only off the bike [CP; sizes our decision]', () => {
    const ranked = rankFitCauses([
      symptom({ region: 'knee-back-left', pain: 4, timing: ['after-ride'], durationDays: 3 }),
      symptom({ region: 'knee-front-left', pain: 4, timing: ['during-ride'], durationDays: 30 }),
    ]);
    expect(ranked[0]?.cause).toBe('saddle-low');
    expect(ranked[0]?.score).toBe(6);
    expect(ranked.find((c) => c.cause === 'saddle-high')?.score).toBe(4);
    const offBike = rankFitCauses([symptom({ pain: 6, timing: ['at-night'], durationDays: 3 })]);
    expect(offBike[0]?.score).toBe(3);
  });

  it('gives hip pain its own row: check for hip rocking first, then saddle height, leg length and a low front end', () => {
    const ranked = rankFitCauses([symptom({ region: 'hip-right', pain: 3 })]);
    expect(ranked.map((c) => c.cause)).toEqual(['hip-rocking', 'saddle-high', 'leg-length-difference', 'bars-low']);
    expect(ranked[0]?.text).toMatch(/Check whether the hips rock/);
    expect(CAUSE_TABLE['hip-pain'].source).toMatch(/not in TRADE §5.*from memory/);
  });

  it('words every cause as something to check, never a diagnosis', () => {
    const all = rankFitCauses(BODY_REGIONS.map((region) => symptom({ region, pain: 5 })));
    for (const c of all) expect(c.text).not.toMatch(/you have|diagnos/i);
    expect(all.length).toBeGreaterThan(15);
  });

  it('refuses a pain score outside 0–10 or an unknown region', () => {
    expect(() => rankFitCauses([symptom({ pain: 11 })])).toThrow(FitInputError);
    expect(() => rankFitCauses([symptom({ region: 'elbow' as never })])).toThrow(FitInputError);
  });
});

describe('red-flag screen (TRADE §6: NICE NG59, Stiell 1996 [V])', () => {
  const urgentIds = ['saddle-numbness-persists', 'bladder-bowel-change', 'leg-weakness', 'hot-swollen-joint', 'fever-with-pain'] as const;
  const soonIds = ['pain-at-rest-or-night', 'swelling-locking-giving-way', 'numbness-persists-off-bike', 'severe-pain'] as const;
  const routineIds = ['crash-or-fall', 'not-settled-after-changes'] as const;

  it('has stable ids and plain questions', () => {
    const ids = RED_FLAG_QUESTIONS.map((q) => q.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const q of RED_FLAG_QUESTIONS) expect(q.text).toMatch(/\?$/);
  });

  it('finds no flag when every answer is no', () => {
    const r = screenRedFlags({ answers: Object.fromEntries(RED_FLAG_QUESTIONS.map((q) => [q.id, false])) });
    expect(r).toMatchObject({ level: 'none', triggers: [], advice: REFERRAL_ADVICE.none });
  });

  it.each(urgentIds)('sends "%s" to urgent care (NICE NG59; BMJ Best Practice [V])', (id) => {
    const r = screenRedFlags({ answers: { [id]: true } });
    expect(r.level).toBe('urgent');
    expect(r.triggers.map((t) => t.id)).toEqual([id]);
    expect(r.advice).toMatch(/Stop riding/);
  });

  it.each(soonIds)('sends "%s" to a physio soon (TRADE §6 [V])', (id) => {
    expect(screenRedFlags({ answers: { [id]: true } }).level).toBe('physio-soon');
  });

  it.each(routineIds)('sends "%s" to a physio routinely (TRADE §6 [V])', (id) => {
    expect(screenRedFlags({ answers: { [id]: true } }).level).toBe('physio-routine');
  });

  it('does not flag saddle numbness while riding on its own (a fit cause: Lowe et al. 2004 [V]), nor back pain alone', () => {
    expect(screenRedFlags({ answers: { 'saddle-numbness-riding': true } }).level).toBe('none');
    expect(screenRedFlags({ answers: { 'back-pain': true } }).level).toBe('none');
  });

  it('sends saddle numbness with back pain to urgent care (cauda equina signs, NICE NG59 [V])', () => {
    const r = screenRedFlags({ answers: { 'saddle-numbness-riding': true, 'back-pain': true } });
    expect(r.level).toBe('urgent');
    expect(r.triggers.map((t) => t.id)).toEqual(['saddle-numbness-with-signs']);
  });

  it('applies the Ottawa knee rules only after a crash (Stiell et al. 1996 [V])', () => {
    expect(screenRedFlags({ answers: { 'kneecap-tender': true } }).level).toBe('none');
    for (const id of ['kneecap-tender', 'fibular-head-tender', 'cannot-bend-knee-90', 'cannot-take-four-steps'] as const) {
      const r = screenRedFlags({ answers: { 'crash-or-fall': true, [id]: true } });
      expect(r.level).toBe('physio-soon');
      expect(r.triggers.map((t) => t.id)).toContain('crash-with-ottawa-sign');
    }
    const aged = screenRedFlags({ answers: { 'crash-or-fall': true }, age: 60, symptoms: [symptom({ afterCrash: true })] });
    expect(aged.level).toBe('physio-soon');
    const agedNoKnee = screenRedFlags({ answers: { 'crash-or-fall': true }, age: 60, symptoms: [symptom({ region: 'neck' })] });
    expect(agedNoKnee.level).toBe('physio-routine');
  });

  it('raises two routine findings together to soon', () => {
    const r = screenRedFlags({ answers: { 'crash-or-fall': true, 'not-settled-after-changes': true } });
    expect(r.level).toBe('physio-soon');
    expect(r.triggers.map((t) => t.id)).toContain('several-findings');
  });

  it('keeps urgent on top whatever else is present', () => {
    const r = screenRedFlags({ answers: { 'fever-with-pain': true, 'pain-at-rest-or-night': true, 'crash-or-fall': true } });
    expect(r.level).toBe('urgent');
    expect(r.triggers).toHaveLength(3);
    expect(maxReferral('physio-soon', 'physio-routine')).toBe('physio-soon');
  });

  it('reads flags from the body-map symptoms too', () => {
    expect(screenRedFlags({ symptoms: [symptom({ timing: ['at-night'] })] }).level).toBe('physio-soon');
    expect(screenRedFlags({ symptoms: [symptom({ swelling: true })] }).level).toBe('physio-soon');
    expect(screenRedFlags({ symptoms: [symptom({ pain: 7 })] }).level).toBe('physio-soon');
    expect(screenRedFlags({ symptoms: [symptom({ afterCrash: true })] }).level).toBe('physio-routine');
    expect(screenRedFlags({ symptoms: [symptom({ region: 'hand-left', kind: 'tingling', timing: ['after-ride'] })] }).level).toBe('physio-soon');
    expect(screenRedFlags({ symptoms: [symptom({ region: 'hand-left', kind: 'tingling' })] }).level).toBe('none');
    expect(screenRedFlags({ symptoms: [symptom({ region: 'perineum', numbness: true, timing: ['after-ride'] })] }).level).toBe('urgent');
    const both = screenRedFlags({ symptoms: [symptom({ region: 'perineum', kind: 'numb' }), symptom({ region: 'lower-back' })] });
    expect(both.level).toBe('urgent');
  });

  it('refuses unknown question ids', () => {
    expect(() => screenRedFlags({ answers: { 'not-a-question': true } as never })).toThrow(FitInputError);
  });
});

describe('cautions', () => {
  it('say the service does not diagnose, when to see a clinician, and to follow local law', () => {
    const text = CAUTIONS.join(' ');
    expect(text).toMatch(/does not diagnose/);
    for (const word of ['severe', 'at rest', 'night', 'numbness', 'swelling', 'crash']) expect(text).toContain(word);
    expect(text).toMatch(/local laws and licensed practice/);
  });
});
