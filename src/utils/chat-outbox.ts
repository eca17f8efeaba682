import { z } from 'zod';

/**
 * Messages the server has not yet acknowledged, kept in sessionStorage so a reload (or a closed
 * connection) resends them with the same client id; the server stores each client id once.
 */
export const outboxEntrySchema = z.object({
  clientId: z.uuid(),
  consultationId: z.number().int().positive(),
  body: z.string(),
  attachmentId: z.number().int().positive().optional(),
  attachment: z.object({ id: z.number(), kind: z.enum(['photo', 'clip']), view: z.string().nullable() }).nullable().default(null),
  createdAt: z.string(),
});
export type OutboxEntry = z.infer<typeof outboxEntrySchema>;

const storageKey = (userId: number) => `saddlestep.chat.outbox.${userId}`;

export function loadOutbox(userId: number): OutboxEntry[] {
  try {
    const raw = sessionStorage.getItem(storageKey(userId));
    if (!raw) return [];
    const parsed = z.array(outboxEntrySchema).safeParse(JSON.parse(raw));
    return parsed.success ? parsed.data : [];
  } catch {
    // Storage turned off or a damaged entry: start empty rather than break the chat.
    return [];
  }
}

export function saveOutbox(userId: number, entries: OutboxEntry[]): void {
  try {
    if (entries.length === 0) sessionStorage.removeItem(storageKey(userId));
    else sessionStorage.setItem(storageKey(userId), JSON.stringify(entries));
  } catch {
    // A full or blocked storage only costs the resend after a reload; the live outbox still works.
  }
}

/** Error codes worth sending again by themselves: the server or the network may do better next time. */
export const TRANSIENT_CODES: readonly string[] = ['internal_error', 'timeout', 'disconnected'];
