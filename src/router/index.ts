import { watch } from 'vue';
import { createRouter, createWebHistory } from 'vue-router';
import type { Pinia } from 'pinia';
import { useAuthStore } from '@/stores/auth';
import { HOME_ROUTE } from './homes';
import { ROUTE, WRONG_ROLE_NOTICE, routes } from './routes';

export function createAppRouter(pinia: Pinia) {
  const router = createRouter({
    history: createWebHistory(import.meta.env.BASE_URL),
    routes,
    scrollBehavior: (_to, _from, saved) => saved ?? { top: 0 },
  });
  const auth = useAuthStore(pinia);

  router.beforeEach(async (to) => {
    await auth.ensureLoaded();
    const user = auth.user;
    const roles = to.meta.roles;
    if (roles) {
      if (!user) return { name: ROUTE.signIn, query: { redirect: to.fullPath } };
      if (!roles.includes(user.role)) return { name: HOME_ROUTE[user.role], query: { notice: WRONG_ROLE_NOTICE } };
    }
    if (to.meta.guestOnly && user) return { name: HOME_ROUTE[user.role] };
    return true;
  });

  router.afterEach((to) => {
    document.title = to.meta.title ? `${to.meta.title} · Saddlestep` : 'Saddlestep';
  });

  // The server ended the session (expired, signed out elsewhere): leave guarded pages at once.
  watch(
    () => auth.sessionEndedCount,
    () => {
      const current = router.currentRoute.value;
      if (!current.meta.roles) return;
      void router.replace({ name: ROUTE.signIn, query: { redirect: current.fullPath, notice: 'session-ended' } });
    },
  );

  return router;
}
