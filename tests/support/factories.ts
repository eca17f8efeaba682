import { randomUUID } from 'node:crypto';
import type { Role } from '@shared/auth';
import { User } from '@server/models';
import { createPasswordHasher } from '@server/services/passwords';
import { browserLikeAgent, type BrowserLikeAgent } from './app';
import type { SaddlestepApp } from '@server/app';

export const TEST_PASSWORD = 'correct-horse-battery';
const hasher = createPasswordHasher(10);
let cachedHash: string | null = null;

/** A unique, valid e-mail so test files can share one database without colliding. */
export function uniqueEmail(prefix = 'user'): string {
  return `${prefix}-${randomUUID().slice(0, 12)}@test.example`;
}

/** Insert a user directly (fast path for tests that are not about registration). */
export async function buildUser(fields: Partial<{ role: Role; status: User['status']; email: string; displayName: string; timeZone: string }> = {}) {
  cachedHash ??= await hasher.hash(TEST_PASSWORD);
  return User.create({
    email: fields.email ?? uniqueEmail(fields.role ?? 'rider'),
    passwordHash: cachedHash,
    role: fields.role ?? 'rider',
    displayName: fields.displayName ?? 'Test Person',
    timeZone: fields.timeZone ?? 'Europe/London',
    status: fields.status ?? 'active',
  });
}

/** A signed-in browser-like client for a new user of the given role. */
export async function signedInAs(app: SaddlestepApp['app'], role: Role): Promise<BrowserLikeAgent & { user: User }> {
  const user = await buildUser({ role });
  const client = await browserLikeAgent(app);
  const res = await client.post('/api/auth/sign-in', { email: user.email, password: TEST_PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  client.csrfToken = res.body.csrfToken as string;
  return Object.assign(client, { user });
}
