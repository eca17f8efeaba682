/**
 * A token bucket per user: `capacity` messages at once, refilled at `perSecond`. In memory, per
 * process: enough to stop a runaway client or a flood; a cluster would move it to shared storage.
 */
export function createSendLimiter({ capacity, perSecond }: { capacity: number; perSecond: number }) {
  const buckets = new Map<number, { tokens: number; at: number }>();
  return {
    take(userId: number, now = Date.now()): boolean {
      const bucket = buckets.get(userId) ?? { tokens: capacity, at: now };
      bucket.tokens = Math.min(capacity, bucket.tokens + ((now - bucket.at) / 1000) * perSecond);
      bucket.at = now;
      const allowed = bucket.tokens >= 1;
      if (allowed) bucket.tokens -= 1;
      buckets.set(userId, bucket);
      if (buckets.size > 50_000) buckets.clear(); // bound memory; a reset only forgives
      return allowed;
    },
  };
}
export type SendLimiter = ReturnType<typeof createSendLimiter>;
