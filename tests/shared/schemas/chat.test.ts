import { describe, expect, it } from 'vitest';
import { HISTORY_PAGE_MAX, historySchema, joinRoomSchema, MESSAGE_MAX_CHARS, receiptSchema, sendMessageSchema, typingSchema } from '@shared/chat';
import { problems } from './problems';

const clientId = '3f1c2a4e-8b7d-4c6e-9a1b-2c3d4e5f6a7b';

describe('joinRoomSchema', () => {
  it('starts from the beginning of the thread when no sequence number is given', () => {
    expect(joinRoomSchema.parse({ consultationId: 12 })).toEqual({ consultationId: 12, afterSeq: 0 });
    expect(joinRoomSchema.parse({ consultationId: 12, afterSeq: 40 })).toEqual({ consultationId: 12, afterSeq: 40 });
  });

  it('asks which consultation when it is missing or not a number', () => {
    expect(problems(joinRoomSchema, {})).toEqual({ consultationId: 'Say which consultation.' });
    expect(problems(joinRoomSchema, { consultationId: '12' })).toEqual({ consultationId: 'Say which consultation.' });
  });

  it('refuses ids and sequence numbers outside their ranges', () => {
    for (const consultationId of [0, -1, 1.5, 4_294_967_296]) expect(joinRoomSchema.safeParse({ consultationId }).success).toBe(false);
    expect(problems(joinRoomSchema, { consultationId: 1, afterSeq: 'last' })).toEqual({ afterSeq: 'A sequence number is a whole number.' });
    for (const afterSeq of [-1, 2_147_483_648]) expect(joinRoomSchema.safeParse({ consultationId: 1, afterSeq }).success).toBe(false);
  });

  it('refuses extra fields', () => {
    expect(joinRoomSchema.safeParse({ consultationId: 1, userId: 2 }).success).toBe(false);
  });
});

describe('sendMessageSchema', () => {
  it('keeps a text message exactly as typed', () => {
    const body = '  Saddle up 3 mm?\n\tThanks  ';
    expect(sendMessageSchema.parse({ consultationId: 1, clientId, body })).toEqual({ consultationId: 1, clientId, body });
  });

  it('accepts a photo without text, with an empty body', () => {
    expect(sendMessageSchema.parse({ consultationId: 1, clientId, attachmentId: 8 })).toEqual({ consultationId: 1, clientId, body: '', attachmentId: 8 });
  });

  it('needs text or an attachment', () => {
    expect(problems(sendMessageSchema, { consultationId: 1, clientId })).toEqual({ body: 'Write a message or attach a file.' });
    expect(problems(sendMessageSchema, { consultationId: 1, clientId, body: ' \n\t ' })).toEqual({ body: 'Write a message or attach a file.' });
  });

  it('needs a UUID client id so resends are not stored twice', () => {
    expect(problems(sendMessageSchema, { consultationId: 1, clientId: 'msg-1', body: 'hi' })).toEqual({ clientId: 'Each message needs a client id (a UUID).' });
    expect(problems(sendMessageSchema, { consultationId: 1, body: 'hi' })).toEqual({ clientId: 'Each message needs a client id (a UUID).' });
  });

  it('refuses a body that is not text or is too long', () => {
    expect(problems(sendMessageSchema, { consultationId: 1, clientId, body: 42 })).toEqual({ body: 'A message is text.' });
    expect(sendMessageSchema.parse({ consultationId: 1, clientId, body: 'x'.repeat(MESSAGE_MAX_CHARS) }).body).toHaveLength(4000);
    expect(problems(sendMessageSchema, { consultationId: 1, clientId, body: 'x'.repeat(MESSAGE_MAX_CHARS + 1) })).toEqual({ body: 'A message can be at most 4000 characters.' });
  });

  it.each(['bell\u0007', 'nul\u0000', 'esc\u001b[31m', 'c1\u0085'])('refuses control characters in %j', (body) => {
    expect(problems(sendMessageSchema, { consultationId: 1, clientId, body })).toEqual({ body: 'A message cannot contain control characters.' });
  });

  it('allows tabs, new lines and carriage returns', () => {
    expect(sendMessageSchema.parse({ consultationId: 1, clientId, body: 'a\tb\r\nc' }).body).toBe('a\tb\r\nc');
  });

  it('refuses a bad attachment id and a sender chosen by the client', () => {
    expect(sendMessageSchema.safeParse({ consultationId: 1, clientId, attachmentId: 0 }).success).toBe(false);
    expect(sendMessageSchema.safeParse({ consultationId: 1, clientId, body: 'hi', senderId: 3 }).success).toBe(false);
  });
});

describe('historySchema', () => {
  it('pages back 50 messages by default', () => {
    expect(historySchema.parse({ consultationId: 1, beforeSeq: 120 })).toEqual({ consultationId: 1, beforeSeq: 120, limit: 50 });
  });

  it('allows pages of 1 to 100 messages only', () => {
    expect(historySchema.parse({ consultationId: 1, beforeSeq: 120, limit: HISTORY_PAGE_MAX }).limit).toBe(100);
    expect(historySchema.safeParse({ consultationId: 1, beforeSeq: 120, limit: 0 }).success).toBe(false);
    expect(historySchema.safeParse({ consultationId: 1, beforeSeq: 120, limit: 101 }).success).toBe(false);
  });

  it('needs the sequence number to page back from', () => {
    expect(problems(historySchema, { consultationId: 1 })).toEqual({ beforeSeq: 'A sequence number is a whole number.' });
  });
});

describe('receiptSchema and typingSchema', () => {
  it('accept a delivered or read receipt up to a sequence number', () => {
    expect(receiptSchema.parse({ consultationId: 1, seq: 7 })).toEqual({ consultationId: 1, seq: 7 });
    expect(problems(receiptSchema, { consultationId: 1, seq: 1.5 })).toEqual({ seq: 'A sequence number is a whole number.' });
  });

  it('accept a typing flag as yes or no only', () => {
    expect(typingSchema.parse({ consultationId: 1, typing: true })).toEqual({ consultationId: 1, typing: true });
    expect(typingSchema.safeParse({ consultationId: 1, typing: 'yes' }).success).toBe(false);
  });
});
