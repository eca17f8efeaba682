import { randomUUID } from 'node:crypto';
import { buildPlan } from '@shared/fit/planner';
import { analyseCheckIn } from '@shared/fit/checkin';
import { addDays } from '@shared/fit/setup';
import { Bike, CheckIn, Consultation, Message, Plan, PlanStep, User } from '../models';
import { currentSnapshot, recordSnapshot } from '../services/setup-history';

const daysAgo = (n: number) => addDays(new Date().toISOString().slice(0, 10), -n);

/**
 * A plan under way for the demo: Carla (tingling left hand) works with Hanna on a shorter, higher
 * front end. Step 1 was made a few days ago and checked in on; step 2 waits for its date. All
 * invented. Idempotent: nothing is added once Carla and Hanna have a consultation.
 */
export async function seedDemoCare(): Promise<void> {
  const carla = await User.findOne({ where: { email: 'carla@rider.example' } });
  const hanna = await User.findOne({ where: { email: 'hanna@larchmont.example' } });
  if (!carla || !hanna || (await Consultation.count({ where: { riderId: carla.id, fitterId: hanna.id } })) > 0) return;
  const bike = await Bike.findOne({ where: { riderId: carla.id }, order: [['id', 'ASC']] });
  const baseline = bike ? await currentSnapshot(bike.id) : null;
  if (!bike || !baseline) return;

  const start = baseline.takenOn > daysAgo(4) ? baseline.takenOn : daysAgo(4);
  const target = { ...baseline.setup, reach: baseline.setup.reach - 10, drop: baseline.setup.drop - 10 };
  const inputs = { baseline: baseline.setup, target, currentPain: 3, startDate: start };
  const body = buildPlan(inputs);
  const first = body.steps[0];
  if (!first) return;
  const sessionAt = new Date(`${start}T16:00:00Z`);

  await Consultation.sequelize!.transaction(async (transaction) => {
    const consultation = await Consultation.create(
      { riderId: carla.id, fitterId: hanna.id, intakeId: null, status: 'plan_active', startsAt: sessionAt, endsAt: new Date(sessionAt.getTime() + 3_600_000), holdExpiresAt: null, feeMinor: 110000, currency: 'SEK', calendarUid: `${randomUUID()}@saddlestep`, cancelledById: null, cancelReason: null },
      { transaction },
    );
    const plan = await Plan.create({ consultationId: consultation.id, riderId: carla.id, fitterId: hanna.id, bikeId: bike.id, kind: 'forward', status: 'active', plan: body, inputs, holdReason: null }, { transaction });
    const appliedOn = start;
    const snapshot = await recordSnapshot(bike.id, first.setupAfter, 'step', carla.id, { takenOn: appliedOn, transaction });
    const adaptation = body.limits.adaptationDays;
    await PlanStep.bulkCreate(
      body.steps.map((step, i) => ({
        planId: plan.id, stepIndex: step.index, state: i === 0 ? 'applied' : i === 1 ? 'current' : 'locked', earliestDate: i === 1 ? addDays(appliedOn, adaptation) : step.earliestDate,
        minRides: step.minRides, appliedOn: i === 0 ? appliedOn : null, checkInDue: i === 0 ? addDays(appliedOn, adaptation) : null,
        checkedInAt: i === 0 ? new Date() : null, overdueAt: null, snapshotId: i === 0 ? snapshot.id : null,
      })) as never[],
      { transaction },
    );
    const current = { date: daysAgo(1), rides: 2, regions: [{ region: 'hand-left' as const, pain: 2, comfort: 7 }] };
    const analysis = analyseCheckIn({ baseline: { date: start, regions: [{ region: 'hand-left', pain: 3 }] }, previous: [], current });
    await CheckIn.create({ planId: plan.id, stepIndex: 1, riderId: carla.id, rides: 2, minutesRidden: 150, comfort: 7, pains: [{ region: 'hand-left', pain: 2 }], numbness: false, note: 'Hand a little better on the second ride.', redFlagAnswers: {}, analysis, decision: analysis.decision, reviewedAt: null, reviewedBy: null }, { transaction });
    const lines: [number, 'text' | 'plan', string][] = [
      [hanna.id, 'text', 'Thanks for the photos, Carla. Your reach is long for the stem you have; we will bring the bars back and up in small steps.'],
      [hanna.id, 'plan', `A new plan with ${body.steps.length} steps.`],
      [carla.id, 'text', 'Done step 1 — spacer moved. Second ride felt better on the hoods.'],
    ];
    for (const [i, [senderId, kind, text]] of lines.entries()) {
      await Message.create({ consultationId: consultation.id, seq: i + 1, clientId: randomUUID(), senderId, kind, body: text, attachmentId: null, planId: kind === 'plan' ? plan.id : null }, { transaction });
    }
    await consultation.update({ lastMessageSeq: lines.length }, { transaction });
  });
}
