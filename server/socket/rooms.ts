/** Room names come only from these helpers, so a typo cannot leak a message to the wrong room. */
export const userRoom = (userId: number) => `user:${userId}`;
export const consultationRoom = (consultationId: number) => `consultation:${consultationId}`;
