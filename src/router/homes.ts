import type { Router } from 'vue-router';
import type { Role } from '@shared/auth';
import { ROUTE, type RouteName } from './routes';

/** Each kind of account lands on its own home page. */
export const HOME_ROUTE: Record<Role, RouteName> = {
  rider: ROUTE.riderHome,
  fitter: ROUTE.fitterHome,
  physio: ROUTE.physioHome,
  admin: ROUTE.adminHome,
};

/**
 * Where to go after signing in. Honours `?redirect=` only for a path inside this app that the
 * role may open, so a crafted link can neither leave the site nor bounce off a role guard.
 */
export function afterSignInTarget(router: Router, role: Role, redirect: unknown): string | { name: RouteName } {
  const home = { name: HOME_ROUTE[role] };
  if (typeof redirect !== 'string' || !redirect.startsWith('/') || redirect.startsWith('//') || redirect.includes('\\')) return home;
  const target = router.resolve(redirect);
  if (target.name === ROUTE.notFound || target.meta.guestOnly) return home;
  if (target.meta.roles && !target.meta.roles.includes(role)) return home;
  return target.fullPath;
}
