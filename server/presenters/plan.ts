import type { Plan, PlanStep, User } from '../models';

/** A stored plan with each step's progress, as rider and fitter see it. */
export function presentPlan(plan: Plan, steps: PlanStep[], fitter: User | null) {
  return {
    id: plan.id,
    consultationId: plan.consultationId,
    bikeId: plan.bikeId,
    kind: plan.kind,
    status: plan.status,
    holdReason: plan.holdReason,
    createdAt: plan.createdAt.toISOString(),
    fitter: fitter ? { id: fitter.id, displayName: fitter.displayName } : null,
    plan: plan.plan,
    steps: [...steps]
      .sort((a, b) => a.stepIndex - b.stepIndex)
      .map((s) => ({
        index: s.stepIndex,
        state: s.state,
        earliestDate: s.earliestDate,
        minRides: s.minRides,
        appliedOn: s.appliedOn,
        checkInDue: s.checkInDue,
        checkedIn: s.checkedInAt !== null,
        overdue: s.overdueAt !== null && s.checkedInAt === null,
        snapshotId: s.snapshotId,
      })),
  };
}
export type PresentedPlan = ReturnType<typeof presentPlan>;
