import { computed, ref } from 'vue';
import type { UnreadCount } from '@shared/chat';
import { socket, withAck, ACK_TIMEOUT_MS } from '@/socket';

/**
 * Unread counts per consultation for the badge, whatever page is open: the server sends
 * `unread:changed` to the user's own room when a message arrives or another tab reads, and the
 * whole list is fetched again on every (re)connect, so a missed notice heals itself.
 */
export function useChatUnread() {
  const unread = ref<Record<number, number>>({});
  const unreadTotal = computed(() => Object.values(unread.value).reduce((sum, n) => sum + n, 0));
  /** The consultation to open from the badge: the one with unread messages when there is exactly one. */
  const onlyUnreadConsultation = computed(() => {
    const ids = Object.entries(unread.value).filter(([, n]) => n > 0).map(([id]) => Number(id));
    return ids.length === 1 ? ids[0]! : null;
  });

  function onUnreadChanged({ consultationId, count }: UnreadCount): void {
    const next = { ...unread.value };
    if (count > 0) next[consultationId] = count;
    else delete next[consultationId];
    unread.value = next;
  }

  async function refreshUnread(): Promise<void> {
    const ack = await withAck<UnreadCount[]>((done) => socket.timeout(ACK_TIMEOUT_MS).emit('unread:list', {}, done));
    // On an error the old counts stay; the next notice or reconnect corrects them.
    if (ack.status === 'OK') unread.value = Object.fromEntries(ack.data.map((u) => [u.consultationId, u.count]));
  }

  function resetUnread(): void {
    unread.value = {};
  }

  return { unread, unreadTotal, onlyUnreadConsultation, onUnreadChanged, refreshUnread, resetUnread };
}
