import type { PlanInput } from '@shared/fit/planner';
import type { Setup } from '@shared/fit/setup';

/** An invented rider's road bike. */
export const BASE: Setup = {
  saddleHeight: 740, saddleSetback: 60, saddleTilt: 0, reach: 520, drop: 80, stemLength: 100,
  spacerStack: 20, crankLength: 172.5, stack: 20, cleatForeAft: 0, cleatRotation: 0,
};

export const inputs = (over: Partial<PlanInput> = {}): PlanInput => ({
  baseline: BASE,
  target: { ...BASE, saddleHeight: 749 },
  currentPain: 2,
  startDate: '2025-03-01',
  ...over,
});
