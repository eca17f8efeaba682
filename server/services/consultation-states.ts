import type { Transaction } from 'sequelize';
import { canTransition, STATE_LABELS, type ConsultationState } from '@shared/consultation';
import { conflict } from '../errors';
import { Consultation, ConsultationEvent } from '../models';
import type { AppContext } from '../context';
import { userRoom } from '../socket/rooms';

/**
 * The only code that changes a consultation's status. It refuses moves the state table does not
 * allow, records who and when, and (after commit) tells both parties over their sockets.
 */
export async function transitionConsultation(
  ctx: Pick<AppContext, 'io'>,
  consultation: Consultation,
  to: ConsultationState,
  options: { actorId: number | null; note?: string; transaction: Transaction; changes?: Partial<Pick<Consultation, 'startsAt' | 'endsAt' | 'holdExpiresAt' | 'cancelledById' | 'cancelReason' | 'calendarSequence'>> },
): Promise<Consultation> {
  const from = consultation.status;
  if (!canTransition(from, to)) {
    throw conflict(`This consultation is ${STATE_LABELS[from].toLowerCase()} and cannot become ${STATE_LABELS[to].toLowerCase()}.`);
  }
  consultation.set({ ...options.changes, status: to });
  await consultation.save({ transaction: options.transaction });
  await ConsultationEvent.create(
    { consultationId: consultation.id, fromStatus: from, toStatus: to, actorId: options.actorId, note: options.note?.slice(0, 500) ?? null },
    { transaction: options.transaction },
  );
  options.transaction.afterCommit(() => {
    const payload = { id: consultation.id, status: to, from, startsAt: consultation.startsAt.toISOString() };
    ctx.io?.to([userRoom(consultation.riderId), userRoom(consultation.fitterId)]).emit('consultation:changed', payload);
  });
  return consultation;
}
