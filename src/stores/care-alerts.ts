import { h, ref, shallowRef } from 'vue';
import { defineStore } from 'pinia';
import type { Router } from 'vue-router';
import { ElNotification } from 'element-plus';
import 'element-plus/es/components/notification/style/css';
import { socket } from '@/socket';
import { useAuthStore } from '@/stores/auth';
import { alertLink, type CareAlert } from '@/utils/care-alerts';

/**
 * Live care alerts (`care:alert`): a check-in that needs the fitter, a referral moving on, a
 * plan paused or released. Each shows an Element Plus notification with a link, and bumps
 * `received` so open pages (Today, My fit, the physio inbox) reload their lists. The socket
 * itself is opened and closed by the chat store; this store only listens on it.
 */
export const useCareAlertsStore = defineStore('care-alerts', () => {
  const auth = useAuthStore();
  /** Counts alerts since start-up; pages watch it to refresh. */
  const received = ref(0);
  const last = shallowRef<CareAlert | null>(null);
  let bound = false;

  function show(alert: CareAlert, router: Router): void {
    const role = auth.user?.role;
    if (!role) return;
    const link = alertLink(alert, role);
    const urgent = alert.kind === 'checkin-urgent';
    const open = () => {
      notification.close();
      void router.push(link.to);
    };
    // Plain text only: the message is built by the server from names, never rendered as HTML.
    const notification = ElNotification({
      title: urgent ? 'Urgent' : 'Needs your attention',
      type: urgent ? 'error' : 'warning',
      duration: urgent ? 0 : 15_000,
      customClass: 'care-alert',
      message: h('div', { 'data-test': 'care-alert', 'data-kind': alert.kind }, [
        h('p', { class: 'care-alert__text' }, alert.message),
        h('a', { href: router.resolve(link.to).href, 'data-test': 'care-alert-open', onClick: (event: MouseEvent) => (event.preventDefault(), open()) }, link.label),
      ]),
    });
  }

  /** Called once at start-up, with the app's router for the notification links. */
  function start(router: Router): void {
    if (bound) return;
    bound = true;
    socket.on('care:alert', (alert) => {
      last.value = alert;
      received.value += 1;
      show(alert, router);
    });
  }

  return { received, last, start };
});
