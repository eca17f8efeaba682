import { buildPlan, type PlanInput } from '@shared/fit/planner';
import { PlanStep } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { signedInAs } from './factories';
import { caseWithBike, TEST_SETUP } from './plan-factories';

export const today = () => new Date().toISOString().slice(0, 10);

type Case = Awaited<ReturnType<typeof caseWithBike>>;

/** Build and send a plan the way the workspace does; returns the stored plan's id. */
export async function sendBuiltPlan(c: Case, target: PlanInput['target']) {
  const inputs = (await c.fitter.get(`/api/consultations/${c.consultation.id}/plan-inputs?bikeId=${c.bikeId}`).expect(200)).body;
  const { bikeId: _b, physio, ...rest } = inputs;
  const plan = buildPlan({ ...rest, ...(physio ? { physio } : {}), target });
  return c.fitter.post(`/api/consultations/${c.consultation.id}/plans`, { bikeId: c.bikeId, target, startDate: inputs.startDate, plan });
}

/** A case with a two-step saddle plan whose first step the rider has made today. */
export async function caseOnStepOne(app: SaddlestepApp['app']) {
  const c = await caseWithBike(app, { started: true });
  const sent = await sendBuiltPlan(c, { ...TEST_SETUP, saddleHeight: TEST_SETUP.saddleHeight + 6 });
  if (sent.status !== 201) throw new Error(`plan not sent: ${sent.status} ${JSON.stringify(sent.body)}`);
  const planId = sent.body.plan.id as number;
  await c.rider.post(`/api/plans/${planId}/steps/1/apply`, { appliedOn: today() }).expect(200);
  const physio = await signedInAs(app, 'physio');
  return { ...c, planId, physio };
}

/** A check-in with every safety question answered no unless overridden. */
export function checkInBody(overrides: Record<string, unknown> = {}) {
  return { rides: 5, minutesRidden: 300, comfort: 7, pains: [{ region: 'knee-front-left', pain: 3 }], numbness: false, note: '', redFlagAnswers: {}, ...overrides };
}

/** Let the next step's date arrive (the adaptation clock is days; tests cannot wait). */
export async function skipAdaptationDays(planId: number, stepIndex: number) {
  await PlanStep.update({ earliestDate: today() }, { where: { planId, stepIndex } });
}
