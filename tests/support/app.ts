import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { loadConfig, type Config } from '@server/config';
import { createApp, type SaddlestepApp } from '@server/app';
import { migrateUp } from '@server/migrator';

export function requireTestEnv(): void {
  if (!process.env.DATABASE_URL) {
    throw new Error('Server tests need the test stack: run them through `npm test` (e.g. `npm test -- tests/server`).');
  }
}

/**
 * The real app against the real test database, built once per test file. Supertest drives it
 * over HTTP without a listening port; `listen()` opens one for socket.io clients.
 */
export async function startTestApp(overrides: Partial<Record<keyof Config, string>> = {}): Promise<SaddlestepApp> {
  requireTestEnv();
  const config = loadConfig({ ...process.env, CLIENT_DIST: '', ...overrides });
  const saddlestep = createApp(config);
  await migrateUp(saddlestep.sequelize);
  return saddlestep;
}

/** A cookie-keeping client that has fetched its CSRF token, like a browser tab. */
export async function browserLikeAgent(app: SaddlestepApp['app']) {
  const agent = request.agent(app);
  const res = await agent.get('/api/auth/csrf').expect(200);
  let csrfToken = res.body.csrfToken as string;
  return {
    agent,
    get csrfToken() {
      return csrfToken;
    },
    set csrfToken(token: string) {
      csrfToken = token;
    },
    get: (url: string) => agent.get(url),
    post: (url: string, body?: unknown) => agent.post(url).set('X-CSRF-Token', csrfToken).send(body as object),
    put: (url: string, body?: unknown) => agent.put(url).set('X-CSRF-Token', csrfToken).send(body as object),
    patch: (url: string, body?: unknown) => agent.patch(url).set('X-CSRF-Token', csrfToken).send(body as object),
    delete: (url: string) => agent.delete(url).set('X-CSRF-Token', csrfToken),
  };
}
export type BrowserLikeAgent = Awaited<ReturnType<typeof browserLikeAgent>>;
export type { TestAgent };
