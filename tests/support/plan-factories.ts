import type { Setup } from '@shared/fit/setup';
import type { SaddlestepApp } from '@server/app';
import { calmIntake } from './booking-factories';
import { bookedPair, startingSoon } from './chat-factories';

/** An invented road setup for tests. */
export const TEST_SETUP: Setup = {
  saddleHeight: 740, saddleSetback: 60, saddleTilt: 0, reach: 550, drop: 70, stemLength: 100,
  spacerStack: 20, crankLength: 172.5, stack: 20, cleatForeAft: 0, cleatRotation: 0,
};

/**
 * A booked consultation whose rider has a submitted intake and a bike with a baseline setup
 * taken `baselineDaysAgo` days ago (riders usually record what they have ridden for a while).
 * `started` starts the live session too, as a fitter does before sending a plan.
 */
export async function caseWithBike(app: SaddlestepApp['app'], options: { baselineDaysAgo?: number; setup?: Setup; started?: boolean } = {}) {
  const pair = await bookedPair(app);
  const intake = await pair.rider.post('/api/rider/intake/submit', calmIntake());
  if (intake.status >= 300) throw new Error(`intake failed: ${intake.status}`);
  const takenOn = new Date(Date.now() - (options.baselineDaysAgo ?? 60) * 86_400_000).toISOString().slice(0, 10);
  const bike = await pair.rider.post('/api/rider/bikes', {
    name: 'Test road bike',
    kind: 'road',
    baseline: { unit: 'mm', setup: options.setup ?? TEST_SETUP, cleatNotes: '', takenOn },
  });
  if (bike.status !== 201) throw new Error(`bike create failed: ${bike.status} ${JSON.stringify(bike.body)}`);
  if (options.started) {
    await startingSoon(pair.consultation);
    const started = await pair.fitter.post(`/api/consultations/${pair.consultation.id}/start`);
    if (started.status !== 200) throw new Error(`session start failed: ${started.status} ${JSON.stringify(started.body)}`);
  }
  return { ...pair, bikeId: bike.body.bike.id as number };
}
