import { computed, onBeforeUnmount, ref, watch, type Ref } from 'vue';
import { formatCountdown } from '@/utils/time';

/** Time left until an instant, ticking once a second while the page is open. */
export function useCountdown(until: Ref<string | null | undefined>) {
  const now = ref(Date.now());
  let timer: ReturnType<typeof setInterval> | null = null;

  function stop(): void {
    if (timer) clearInterval(timer);
    timer = null;
  }

  const remainingMs = computed(() => (until.value ? new Date(until.value).getTime() - now.value : 0));
  const expired = computed(() => Boolean(until.value) && remainingMs.value <= 0);
  const label = computed(() => formatCountdown(remainingMs.value));

  watch(
    until,
    (value) => {
      stop();
      now.value = Date.now();
      if (!value) return;
      timer = setInterval(() => {
        now.value = Date.now();
        if (remainingMs.value <= 0) stop();
      }, 1000);
    },
    { immediate: true },
  );
  onBeforeUnmount(stop);

  return { remainingMs, expired, label };
}
