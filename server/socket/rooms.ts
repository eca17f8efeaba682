/** Room names come only from these helpers, so a typo cannot leak a message to the wrong room. */
export const userRoom = (userId: number) => `user:${userId}`;
export const consultationRoom = (consultationId: number) => `consultation:${consultationId}`;
/** Every socket opened with one browser session, so signing that session out can close exactly them. */
export const sessionRoom = (sessionId: string) => `session:${sessionId}`;
