import { z } from 'zod';

/** Longest chat message, in characters (about a page of text). */
export const MESSAGE_MAX_CHARS = 4000;
/** Most messages returned by one history or catch-up page. */
export const HISTORY_PAGE_MAX = 100;

const consultationId = z.number({ error: 'Say which consultation.' }).int().positive().max(4_294_967_295);
const seq = z.number({ error: 'A sequence number is a whole number.' }).int().min(0).max(2_147_483_647);

const body = z
  .string({ error: 'A message is text.' })
  .max(MESSAGE_MAX_CHARS, `A message can be at most ${MESSAGE_MAX_CHARS} characters.`)
  // Control characters other than tab and new line would corrupt the thread and the e-mail notice.
  .refine((text) => !/[^\P{Cc}\t\n\r]/u.test(text), 'A message cannot contain control characters.');

export const joinRoomSchema = z.strictObject({
  consultationId,
  /** The last sequence number this client saw; the server sends everything after it. */
  afterSeq: seq.default(0),
});

export const sendMessageSchema = z
  .strictObject({
    consultationId,
    /** The client's id for this message (a UUID); a resend with the same id is not stored twice. */
    clientId: z.uuid({ error: 'Each message needs a client id (a UUID).' }),
    body: body.default(''),
    /** An upload already made through the upload pipeline, shown in the thread. */
    attachmentId: z.number().int().positive().max(4_294_967_295).optional(),
  })
  .refine((m) => m.body.trim().length > 0 || m.attachmentId !== undefined, { message: 'Write a message or attach a file.', path: ['body'] });

export const historySchema = z.strictObject({
  consultationId,
  /** Messages with a smaller sequence number than this, newest first. */
  beforeSeq: seq,
  limit: z.number().int().min(1).max(HISTORY_PAGE_MAX).default(50),
});

export const leaveRoomSchema = z.strictObject({ consultationId });
export const receiptSchema = z.strictObject({ consultationId, seq });
export const typingSchema = z.strictObject({ consultationId, typing: z.boolean() });
/** `unread:list` takes no arguments; an empty object keeps every event's payload an object. */
export const unreadListSchema = z.strictObject({});

export type JoinRoomInput = z.input<typeof joinRoomSchema>;
export type SendMessageInput = z.input<typeof sendMessageSchema>;
export type HistoryInput = z.input<typeof historySchema>;
export type ReceiptInput = z.input<typeof receiptSchema>;
export type TypingInput = z.input<typeof typingSchema>;
export type LeaveRoomInput = z.input<typeof leaveRoomSchema>;

/** Messages from others after the reader's read cursor, per consultation (the unread badge). */
export interface UnreadCount {
  consultationId: number;
  count: number;
}

export const MESSAGE_KINDS = ['text', 'plan', 'system'] as const;
export type MessageKind = (typeof MESSAGE_KINDS)[number];

/** A stored message as both clients receive it. `body` is plain text, always rendered as text. */
export interface ChatMessage {
  id: number;
  consultationId: number;
  seq: number;
  clientId: string;
  senderId: number | null;
  kind: MessageKind;
  body: string;
  attachment: { id: number; kind: 'photo' | 'clip'; view: string | null } | null;
  /** For `plan` messages: the plan the card opens. */
  planId: number | null;
  createdAt: string;
}

export interface ChatCursor {
  userId: number;
  deliveredSeq: number;
  readSeq: number;
}

export interface RoomState {
  messages: ChatMessage[];
  /** True when there are more messages after these (call join again with the last seq). */
  hasMore: boolean;
  lastSeq: number;
  cursors: ChatCursor[];
  online: number[];
  participants: { id: number; displayName: string; role: string }[];
}
