import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SaddlestepApp } from '@server/app';
import { browserLikeAgent, startTestApp } from '../support/app';
import { uniqueEmail } from '../support/factories';

let saddlestep: SaddlestepApp;
beforeAll(async () => {
  // A small limit so the test stays quick; production defaults to 20 per 15 minutes.
  saddlestep = await startTestApp({ AUTH_RATE_LIMIT: '5', AUTH_RATE_WINDOW_SECONDS: '600' });
});
afterAll(async () => {
  await saddlestep.close();
});

describe('sign-in and registration rate limit', () => {
  it('answers 429 with a clear message once the limit is passed', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    const statuses: number[] = [];
    for (let i = 0; i < 6; i += 1) {
      const res = await client.post('/api/auth/sign-in', { email: uniqueEmail('guess'), password: 'guess-guess-guess' });
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(statuses[5]).toBe(429);
    const last = await client.post('/api/auth/register', { email: uniqueEmail('late') });
    expect(last.status).toBe(429);
    expect(last.body.error).toEqual({ code: 'rate_limited', message: 'Too many attempts. Please wait a few minutes and try again.' });
  });

  it('does not limit ordinary reads', async () => {
    const client = await browserLikeAgent(saddlestep.app);
    for (let i = 0; i < 8; i += 1) await client.get('/api/auth/csrf').expect(200);
  });
});
