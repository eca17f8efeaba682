import { computed, ref, watch } from 'vue';
import { defineStore } from 'pinia';
import type { ChatMessage, RoomState } from '@shared/chat';
import { socket, withAck, ACK_TIMEOUT_MS } from '@/socket';
import { useAuthStore } from '@/stores/auth';
import { loadOutbox, saveOutbox, TRANSIENT_CODES, type OutboxEntry } from '@/utils/chat-outbox';
import { deliveryOf, mergeBySeq } from '@/utils/chat';
import { useChatReceipts } from '@/composables/useChatReceipts';
import { useChatTyping } from '@/composables/useChatTyping';
import { useChatUnread } from '@/composables/useChatUnread';
import { sessionApi } from '@/api/session';

const EARLIER_PAGE = 50;

export interface FailedEntry extends OutboxEntry {
  error: string;
}
type Attachment = NonNullable<OutboxEntry['attachment']>;
type Participant = RoomState['participants'][number];

/**
 * The live chat of one consultation at a time. Never loses or doubles a message: each outgoing
 * message has a client id and waits in a persisted outbox until the server acknowledges it;
 * every (re)connect joins again after the highest sequence number seen and resends what is
 * still waiting; incoming messages are merged by sequence number.
 */
export const useChatStore = defineStore('chat', () => {
  const auth = useAuthStore();
  const userId = ref<number | null>(null);
  const connected = ref(false);
  const connectError = ref<string | null>(null);
  const consultationId = ref<number | null>(null);
  const joined = ref(false);
  const joinError = ref<string | null>(null);
  const messages = ref<ChatMessage[]>([]);
  const outbox = ref<OutboxEntry[]>([]);
  const failed = ref<FailedEntry[]>([]);
  const online = ref<number[]>([]);
  const participants = ref<Participant[]>([]);
  const hasEarlier = ref(false);
  const loadingEarlier = ref(false);
  const sendNotice = ref<string | null>(null);
  /** The last `consultation:changed` broadcast, so an open page can refresh its status. */
  const lastStatusChange = ref<{ id: number; status: string } | null>(null);

  const inFlight = new Set<string>();
  const attempts = new Map<string, number>();
  let bound = false;

  const room = { consultationId, userId, joined, messages };
  const { cursors, upsertCursor, acknowledge, setThreadVisible, resetReceipts } = useChatReceipts(room);
  const { typingUntil, stopTyping, onTypingChanged, setTyping, resetTyping } = useChatTyping(room);
  const { unread, unreadTotal, onlyUnreadConsultation, onUnreadChanged, refreshUnread, resetUnread } = useChatUnread();

  const maxSeq = () => messages.value[messages.value.length - 1]?.seq ?? 0;
  const minSeq = () => messages.value[0]?.seq ?? 0;
  const here = (e: OutboxEntry) => e.consultationId === consultationId.value;

  const pending = computed(() => outbox.value.filter(here));
  const failedHere = computed(() => failed.value.filter(here));
  const others = computed(() => participants.value.filter((p) => p.id !== userId.value).map((p) => ({ ...p, online: online.value.includes(p.id) })));
  const typingNames = computed(() => participants.value.filter((p) => p.id !== userId.value && typingUntil.value[p.id] !== undefined).map((p) => p.displayName.split(' ')[0] ?? p.displayName));
  const stateOf = (m: ChatMessage) => deliveryOf(m, userId.value, cursors.value);

  function resetRoom(): void {
    messages.value = [];
    online.value = [];
    participants.value = [];
    joined.value = false;
    joinError.value = null;
    hasEarlier.value = false;
    sendNotice.value = null;
    resetReceipts();
    resetTyping();
  }

  function receive(list: readonly ChatMessage[]): void {
    const fresh = list.filter((m) => m.consultationId === consultationId.value);
    if (fresh.length === 0) return;
    messages.value = mergeBySeq(messages.value, fresh);
    // A message whose acknowledgement was lost comes back here: it is stored, so stop resending it.
    const stored = new Set(fresh.map((m) => m.clientId));
    if (outbox.value.some((e) => here(e) && stored.has(e.clientId))) outbox.value = outbox.value.filter((e) => !(here(e) && stored.has(e.clientId)));
    for (const m of fresh) if (m.senderId !== null) stopTyping(m.senderId);
  }

  async function history(id: number, beforeSeq: number, limit: number) {
    const ack = await withAck<{ messages: ChatMessage[]; hasMore: boolean }>((done) =>
      socket.timeout(ACK_TIMEOUT_MS).emit('message:history', { consultationId: id, beforeSeq, limit }, done),
    );
    if (ack.status === 'ERROR') {
      joinError.value = ack.errors.message;
      return null;
    }
    return ack.data;
  }

  /** Join (or re-join after a reconnect) and catch up on everything after the highest seq seen. */
  async function joinRoom(id: number): Promise<void> {
    joinError.value = null;
    const firstJoin = messages.value.length === 0;
    for (let page = 0; page < 100; page += 1) {
      const ack = await withAck<RoomState>((done) => socket.timeout(ACK_TIMEOUT_MS).emit('room:join', { consultationId: id, afterSeq: maxSeq() }, done));
      if (consultationId.value !== id) return;
      if (ack.status === 'ERROR') {
        joinError.value = ack.errors.message;
        return;
      }
      const state = ack.data;
      cursors.value = state.cursors;
      online.value = state.online;
      participants.value = state.participants;
      if (firstJoin && page === 0 && state.hasMore) {
        // A long thread opens at its newest page; older pages come on request.
        const latest = await history(id, state.lastSeq + 1, EARLIER_PAGE);
        if (latest) {
          receive(latest.messages);
          hasEarlier.value = latest.hasMore;
        }
        break;
      }
      receive(state.messages);
      if (!state.hasMore) break;
    }
    joined.value = true;
    acknowledge();
    for (const entry of outbox.value.filter((e) => e.consultationId === id)) await deliver(entry);
  }

  async function loadEarlier(): Promise<void> {
    const id = consultationId.value;
    if (id === null || !hasEarlier.value || loadingEarlier.value) return;
    loadingEarlier.value = true;
    try {
      const page = await history(id, minSeq(), EARLIER_PAGE);
      if (page && consultationId.value === id) {
        receive(page.messages);
        hasEarlier.value = page.hasMore;
      }
    } finally {
      loadingEarlier.value = false;
    }
  }

  function retryLater(entry: OutboxEntry): void {
    const n = (attempts.get(entry.clientId) ?? 0) + 1;
    attempts.set(entry.clientId, n);
    const delay = Math.min(30_000, 2_000 * 2 ** Math.min(n, 4));
    setTimeout(() => {
      const still = outbox.value.find((e) => e.clientId === entry.clientId);
      if (still) void deliver(still);
    }, delay);
  }

  async function deliver(entry: OutboxEntry): Promise<void> {
    if (inFlight.has(entry.clientId) || !joined.value || consultationId.value !== entry.consultationId) return;
    inFlight.add(entry.clientId);
    try {
      const payload = { consultationId: entry.consultationId, clientId: entry.clientId, body: entry.body, ...(entry.attachmentId ? { attachmentId: entry.attachmentId } : {}) };
      const ack = await withAck<ChatMessage>((done) => socket.timeout(ACK_TIMEOUT_MS).emit('message:send', payload, done));
      if (ack.status === 'OK') {
        receive([ack.data]);
        outbox.value = outbox.value.filter((e) => e.clientId !== entry.clientId);
        attempts.delete(entry.clientId);
        sendNotice.value = null;
        return;
      }
      sendNotice.value = ack.errors.message;
      if (TRANSIENT_CODES.includes(ack.errors.code)) {
        // Kept in the outbox; a reconnect resends it anyway, a live connection tries again soon.
        if (ack.errors.code !== 'disconnected') retryLater(entry);
        return;
      }
      // Refused for what it is (too long, too fast, not allowed): sending it again would fail again.
      outbox.value = outbox.value.filter((e) => e.clientId !== entry.clientId);
      failed.value = [...failed.value, { ...entry, error: ack.errors.message }];
    } finally {
      inFlight.delete(entry.clientId);
    }
  }

  function send(body: string, attachment?: Attachment): void {
    const id = consultationId.value;
    if (id === null || (body.trim() === '' && !attachment)) return;
    const entry: OutboxEntry = {
      clientId: crypto.randomUUID(),
      consultationId: id,
      body,
      ...(attachment ? { attachmentId: attachment.id } : {}),
      attachment: attachment ?? null,
      createdAt: new Date().toISOString(),
    };
    outbox.value = [...outbox.value, entry];
    setTyping(false);
    void deliver(entry);
  }

  /** A refused message leaves the thread; its text goes back to the composer for editing. */
  function takeBackFailed(clientId: string): FailedEntry | undefined {
    const entry = failed.value.find((e) => e.clientId === clientId);
    failed.value = failed.value.filter((e) => e.clientId !== clientId);
    return entry;
  }

  function enter(id: number): void {
    if (consultationId.value === id) return;
    leave();
    consultationId.value = id;
    if (socket.connected) void joinRoom(id);
  }

  function leave(): void {
    const id = consultationId.value;
    if (id === null) return;
    setTyping(false);
    if (socket.connected && joined.value) socket.emit('room:leave', { consultationId: id }, () => undefined);
    consultationId.value = null;
    resetRoom();
  }

  function bindSocket(): void {
    if (bound) return;
    bound = true;
    socket.on('connect', () => {
      connected.value = true;
      connectError.value = null;
      void refreshUnread();
      if (consultationId.value !== null) void joinRoom(consultationId.value);
    });
    socket.on('disconnect', (reason) => {
      connected.value = false;
      joined.value = false;
      // The server closed it (session ended elsewhere, account switched off, or a restart): socket.io
      // will not reconnect on its own. Ask whether we are still signed in; a 401 signs the tab out.
      if (reason === 'io server disconnect') {
        void sessionApi.stillSignedIn().then(
          () => userId.value !== null && socket.connect(),
          () => (connectError.value = 'Your session has ended. Please sign in again to chat.'),
        );
      }
    });
    socket.on('connect_error', (error) => {
      connectError.value = error.message === 'not_signed_in' ? 'Please sign in again to chat.' : 'Chat is reconnecting…';
    });
    socket.on('message:created', (message) => {
      receive([message]);
      acknowledge();
    });
    socket.on('receipt:updated', ({ consultationId: id, ...cursor }) => {
      if (id === consultationId.value) upsertCursor(cursor);
    });
    socket.on('presence:changed', ({ consultationId: id, online: ids }) => {
      if (id === consultationId.value) online.value = ids;
    });
    socket.on('typing:changed', onTypingChanged);
    socket.on('unread:changed', onUnreadChanged);
    socket.on('consultation:changed', ({ id, status }) => {
      lastStatusChange.value = { id, status };
    });
    document.addEventListener('visibilitychange', acknowledge);
  }

  /** Called once at start-up: bind the listeners, then connect while someone is signed in. */
  function start(): void {
    bindSocket();
    watch(
      () => auth.user?.id ?? null,
      (next) => {
        leave();
        socket.disconnect();
        failed.value = [];
        resetUnread();
        userId.value = next;
        outbox.value = next === null ? [] : loadOutbox(next);
        if (next !== null) socket.connect();
      },
      { immediate: true },
    );
    watch(outbox, (entries) => {
      if (userId.value !== null) saveOutbox(userId.value, entries);
    });
  }

  return {
    userId, connected, connectError, consultationId, joined, joinError, messages, pending, failedHere, cursors, others,
    typingNames, hasEarlier, loadingEarlier, sendNotice, lastStatusChange, unread, unreadTotal, onlyUnreadConsultation,
    stateOf, start, enter, leave, send, loadEarlier, takeBackFailed, setTyping, setThreadVisible,
  };
});
