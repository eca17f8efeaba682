import type { RouteLocationRaw } from 'vue-router';
import type { Role } from '@shared/auth';
import { ROUTE } from '@/router/routes';

/** The `care:alert` payload as the server sends it (`services/care-alerts.ts`, `referral-notices.ts`). */
export interface CareAlert {
  /** `checkin-urgent`, `checkin-<decision>` or `referral-<event>`. */
  kind: string;
  consultationId: number;
  message: string;
}

/**
 * Where an alert's link goes for the one who got it: the fitter to the room's check-ins (or the
 * case), the physio to the inbox, the rider to My plan for a pause and to My fit otherwise.
 */
export function alertLink(alert: CareAlert, role: Role): { to: RouteLocationRaw; label: string } {
  if (role === 'fitter') {
    const tab = alert.kind.startsWith('checkin-') ? 'checkins' : 'case';
    return { to: { name: ROUTE.sessionRoom, params: { id: alert.consultationId }, query: { tab } }, label: 'Open the session room' };
  }
  if (role === 'physio') return { to: { name: ROUTE.physioHome }, label: 'Open your referrals' };
  if (alert.kind === 'referral-hold' || alert.kind === 'referral-hold-cleared') return { to: { name: ROUTE.myPlan }, label: 'Open My plan' };
  return { to: { name: ROUTE.riderHome }, label: 'Open My fit' };
}
