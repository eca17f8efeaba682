import { ref, type Ref } from 'vue';
import type { ChatCursor, ChatMessage } from '@shared/chat';
import { socket, withAck, ACK_TIMEOUT_MS } from '@/socket';

/**
 * Delivered and read cursors for the chat store's current room: this device reports what reached
 * it, and what was on screen while the tab was visible; the room's cursors mark my messages.
 */
export function useChatReceipts(room: { consultationId: Ref<number | null>; userId: Ref<number | null>; joined: Ref<boolean>; messages: Ref<ChatMessage[]> }) {
  const cursors = ref<ChatCursor[]>([]);
  const threadVisible = ref(false);
  const sent = { delivered: 0, read: 0 };

  function upsertCursor(cursor: ChatCursor): void {
    cursors.value = [...cursors.value.filter((c) => c.userId !== cursor.userId), cursor];
  }

  function emitReceipt(kind: 'delivered' | 'read', id: number, seq: number): void {
    if (sent[kind] >= seq) return;
    sent[kind] = seq;
    const event = kind === 'delivered' ? 'message:delivered' : 'message:read';
    void withAck<ChatCursor>((done) => socket.timeout(ACK_TIMEOUT_MS).emit(event, { consultationId: id, seq }, done)).then((ack) => {
      if (ack.status === 'OK') upsertCursor(ack.data);
      else sent[kind] = 0; // say it again at the next chance
    });
  }

  function acknowledge(): void {
    const id = room.consultationId.value;
    const me = room.userId.value;
    if (id === null || me === null || !room.joined.value) return;
    const latest = room.messages.value.filter((m) => m.senderId !== me).reduce((max, m) => Math.max(max, m.seq), 0);
    if (latest === 0) return;
    const mine = cursors.value.find((c) => c.userId === me);
    if (!mine || mine.deliveredSeq < latest) emitReceipt('delivered', id, latest);
    if (threadVisible.value && document.visibilityState === 'visible' && (!mine || mine.readSeq < latest)) emitReceipt('read', id, latest);
  }

  function setThreadVisible(visible: boolean): void {
    threadVisible.value = visible;
    if (visible) acknowledge();
  }

  function resetReceipts(): void {
    cursors.value = [];
    sent.delivered = 0;
    sent.read = 0;
  }

  return { cursors, upsertCursor, acknowledge, setThreadVisible, resetReceipts };
}
