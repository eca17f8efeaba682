import type { Ack } from '../http/errors';
import type { ChatCursor, ChatMessage, HistoryInput, JoinRoomInput, ReceiptInput, RoomState, SendMessageInput, TypingInput } from './schemas';

/** Events the browser sends (domain:verb). Every payload is validated on the server anyway. */
export interface ClientToServerEvents {
  'room:join': (payload: JoinRoomInput, ack: (result: Ack<RoomState>) => void) => void;
  'room:leave': (payload: { consultationId: number }, ack: (result: Ack<null>) => void) => void;
  'message:send': (payload: SendMessageInput, ack: (result: Ack<ChatMessage>) => void) => void;
  'message:history': (payload: HistoryInput, ack: (result: Ack<{ messages: ChatMessage[]; hasMore: boolean }>) => void) => void;
  'message:delivered': (payload: ReceiptInput, ack: (result: Ack<ChatCursor>) => void) => void;
  'message:read': (payload: ReceiptInput, ack: (result: Ack<ChatCursor>) => void) => void;
  'typing:set': (payload: TypingInput) => void;
}

/** Broadcasts (past tense). */
export interface ServerToClientEvents {
  'message:created': (message: ChatMessage) => void;
  'receipt:updated': (payload: { consultationId: number } & ChatCursor) => void;
  'typing:changed': (payload: { consultationId: number; userId: number; typing: boolean }) => void;
  'presence:changed': (payload: { consultationId: number; online: number[] }) => void;
  /** Something in the care loop needs attention (check-in alert, referral change, hold). No health details. */
  'care:alert': (payload: { kind: string; consultationId: number; message: string }) => void;
  'consultation:changed': (payload: { id: number; status: string; from: string; startsAt: string }) => void;
}
