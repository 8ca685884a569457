import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestContext } from '../support/api.js';

let context: TestContext;
beforeAll(async () => {
  context = await startTestApp({ signInAttemptsPerWindow: 12 });
});
afterAll(async () => context.close());

describe('sign-in rate limit', () => {
  it('answers 429 with a clear message once one address has used its attempts', async () => {
    const agent = request.agent(context.app);
    const token = (await agent.get('/api/auth/csrf').expect(200)).body.token as string;
    const statuses: number[] = [];
    let last: request.Response | undefined;
    for (let i = 0; i < 14; i += 1) {
      last = await agent.post('/api/auth/login').set('x-csrf-token', token).send({ email: `nobody${i}@test.example`, password: 'whatever' });
      statuses.push(last.status);
    }
    expect(statuses.slice(0, 12).every((status) => status === 401)).toBe(true);
    expect(statuses.slice(12)).toEqual([429, 429]);
    expect(last?.body.error).toMatchObject({ code: 'too-many-attempts', message: 'Too many sign-in attempts from this address. Wait 15 minutes and try again.' });
    expect(last?.headers['retry-after']).toBeDefined();
  });
});
