import type { Ack } from '../http/errors';
import type { ChatCursor, ChatMessage, HistoryInput, JoinRoomInput, LeaveRoomInput, ReceiptInput, RoomState, SendMessageInput, TypingInput, UnreadCount } from './schemas';

/** Events the browser sends (domain:verb). Every payload is validated on the server anyway. */
export interface ClientToServerEvents {
  'room:join': (payload: JoinRoomInput, ack: (result: Ack<RoomState>) => void) => void;
  'room:leave': (payload: LeaveRoomInput, ack: (result: Ack<null>) => void) => void;
  'message:send': (payload: SendMessageInput, ack: (result: Ack<ChatMessage>) => void) => void;
  'message:history': (payload: HistoryInput, ack: (result: Ack<{ messages: ChatMessage[]; hasMore: boolean }>) => void) => void;
  'message:delivered': (payload: ReceiptInput, ack: (result: Ack<ChatCursor>) => void) => void;
  'message:read': (payload: ReceiptInput, ack: (result: Ack<ChatCursor>) => void) => void;
  /** The ack is optional: typing is fire-and-forget for the browser, but bad input still gets an ERROR. */
  'typing:set': (payload: TypingInput, ack?: (result: Ack<null>) => void) => void;
  /** Unread counts for every consultation the user may chat in (the badge, on each connect). */
  'unread:list': (payload: Record<string, never>, ack: (result: Ack<UnreadCount[]>) => void) => void;
}

/** Broadcasts (past tense). */
export interface ServerToClientEvents {
  'message:created': (message: ChatMessage) => void;
  'receipt:updated': (payload: { consultationId: number } & ChatCursor) => void;
  'typing:changed': (payload: { consultationId: number; userId: number; typing: boolean }) => void;
  'presence:changed': (payload: { consultationId: number; online: number[] }) => void;
  /** To the user's own room: one consultation's unread count changed (a message came, or another tab read). */
  'unread:changed': (payload: UnreadCount) => void;
  /** Something in the care loop needs attention (check-in alert, referral change, hold). No health details. */
  'care:alert': (payload: { kind: string; consultationId: number; message: string }) => void;
  'consultation:changed': (payload: { id: number; status: string; from: string; startsAt: string }) => void;
}
