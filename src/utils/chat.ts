import type { ChatCursor, ChatMessage } from '@shared/chat';

/** What the sender sees beside each of their own messages. */
export type DeliveryState = 'sending' | 'sent' | 'delivered' | 'read' | 'failed';

/**
 * Stored messages are "sent"; "delivered" once another party's delivered cursor reached them and
 * "read" once a read cursor did. Only the sender's own messages carry a state.
 */
export function deliveryOf(message: ChatMessage, me: number | null, cursors: readonly ChatCursor[]): DeliveryState | null {
  if (me === null || message.senderId !== me) return null;
  const others = cursors.filter((c) => c.userId !== me);
  if (others.some((c) => c.readSeq >= message.seq)) return 'read';
  if (others.some((c) => c.deliveredSeq >= message.seq)) return 'delivered';
  return 'sent';
}

/** Messages sorted by sequence number with duplicates dropped (the seq is the server's identity). */
export function mergeBySeq(current: readonly ChatMessage[], incoming: readonly ChatMessage[]): ChatMessage[] {
  const bySeq = new Map<number, ChatMessage>();
  for (const m of current) bySeq.set(m.seq, m);
  for (const m of incoming) if (!bySeq.has(m.seq)) bySeq.set(m.seq, m);
  return [...bySeq.values()].sort((a, b) => a.seq - b.seq);
}

/** Chat times: "14:05" today, "3 Dec, 14:05" otherwise, in the viewer's zone. */
export function messageTime(iso: string, timeZone?: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return '';
  const today = new Date().toDateString() === date.toDateString();
  const options: Intl.DateTimeFormatOptions = today ? { timeStyle: 'short' } : { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' };
  try {
    return new Intl.DateTimeFormat(undefined, { ...options, timeZone }).format(date);
  } catch {
    return new Intl.DateTimeFormat(undefined, options).format(date);
  }
}

/** One row of the thread, whether stored, waiting in the outbox, or refused. */
export interface ThreadItem {
  key: string;
  clientId: string;
  seq: number | null;
  senderId: number | null;
  kind: ChatMessage['kind'];
  body: string;
  attachment: ChatMessage['attachment'];
  planId: number | null;
  createdAt: string;
  state: DeliveryState | null;
  error?: string;
}

export function storedItem(message: ChatMessage, state: DeliveryState | null): ThreadItem {
  return { key: `m${message.seq}`, clientId: message.clientId, seq: message.seq, senderId: message.senderId, kind: message.kind, body: message.body, attachment: message.attachment, planId: message.planId, createdAt: message.createdAt, state };
}

export function waitingItem(entry: { clientId: string; body: string; attachment: ChatMessage['attachment']; createdAt: string; error?: string }, me: number | null): ThreadItem {
  return {
    key: `c${entry.clientId}`, clientId: entry.clientId, seq: null, senderId: me, kind: 'text', body: entry.body, attachment: entry.attachment, planId: null,
    createdAt: entry.createdAt, state: entry.error === undefined ? 'sending' : 'failed', error: entry.error,
  };
}
