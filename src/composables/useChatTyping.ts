import { ref, type Ref } from 'vue';
import { socket } from '@/socket';

/** A typing signal is repeated this often while typing (the server drops it after 6 s of quiet). */
const TYPING_REPEAT_MS = 2_500;
/** How long "is typing…" stays up without a fresh signal, in case the "stopped" signal is lost. */
const TYPING_SHOW_MS = 8_000;

/** Both directions of the typing indicator for the chat store's current room. */
export function useChatTyping(room: { consultationId: Ref<number | null>; userId: Ref<number | null>; joined: Ref<boolean> }) {
  /** Who is typing, until when (ms since epoch). */
  const typingUntil = ref<Record<number, number>>({});
  let typingOn = false;
  let typingSentAt = 0;

  function stopTyping(who: number): void {
    if (typingUntil.value[who] === undefined) return;
    const next = { ...typingUntil.value };
    delete next[who];
    typingUntil.value = next;
  }

  function onTypingChanged({ consultationId, userId: who, typing }: { consultationId: number; userId: number; typing: boolean }): void {
    if (consultationId !== room.consultationId.value || who === room.userId.value) return;
    if (!typing) return stopTyping(who);
    const until = Date.now() + TYPING_SHOW_MS;
    typingUntil.value = { ...typingUntil.value, [who]: until };
    setTimeout(() => {
      if (typingUntil.value[who] === until) stopTyping(who);
    }, TYPING_SHOW_MS);
  }

  /** Typing on (repeated at most every few seconds) or off; off is sent once. */
  function setTyping(on: boolean): void {
    const id = room.consultationId.value;
    if (id === null || !room.joined.value || !socket.connected) return;
    const now = Date.now();
    if (on && typingOn && now - typingSentAt < TYPING_REPEAT_MS) return;
    if (!on && !typingOn) return;
    typingOn = on;
    typingSentAt = now;
    socket.emit('typing:set', { consultationId: id, typing: on });
  }

  function resetTyping(): void {
    typingUntil.value = {};
    typingOn = false;
  }

  return { typingUntil, stopTyping, onTypingChanged, setTyping, resetTyping };
}
