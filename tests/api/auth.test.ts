import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../server/models/index.js';
import { createOrganization, createUser, signIn, startTestApp, TEST_PASSWORD, type TestContext } from '../support/api.js';

let context: TestContext;
beforeAll(async () => {
  context = await startTestApp();
});
afterAll(async () => context.close());

async function csrfAgent() {
  const agent = request.agent(context.app);
  const token = (await agent.get('/api/auth/csrf').expect(200)).body.token as string;
  return { agent, token };
}

describe('sign-in', () => {
  it('signs in with the right password, renews the session id and answers who is signed in', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'engineer');
    const { agent, token } = await csrfAgent();
    const before = (await agent.get('/api/auth/csrf')).headers['set-cookie'];
    const login = await agent.post('/api/auth/login').set('x-csrf-token', token).send({ email: user.email, password: TEST_PASSWORD });
    expect(login.status).toBe(200);
    expect(login.body.user).toMatchObject({ email: user.email, role: 'engineer', organization: { id: organization.id } });
    const cookieAfter = String(login.headers['set-cookie']);
    expect(cookieAfter).toMatch(/statorline\.sid=/);
    expect(cookieAfter).toMatch(/HttpOnly/i);
    expect(cookieAfter).toMatch(/SameSite=Lax/i);
    if (before) expect(cookieAfter).not.toEqual(String(before));
    const me = await agent.get('/api/auth/me').expect(200);
    expect(me.body.user.id).toBe(user.id);
  });

  it('refuses a wrong password with 401 and the one error format', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'viewer');
    const { agent, token } = await csrfAgent();
    const response = await agent.post('/api/auth/login').set('x-csrf-token', token).send({ email: user.email, password: 'wrong password!' });
    expect(response.status).toBe(401);
    expect(response.body).toEqual({ error: { code: 'invalid-credentials', message: 'The e-mail or the password is wrong.' } });
  });

  it('names the field of an invalid sign-in body', async () => {
    const { agent, token } = await csrfAgent();
    const response = await agent.post('/api/auth/login').set('x-csrf-token', token).send({ email: 'not-an-email', password: 'x' });
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe('email: must be an e-mail address');
    expect(response.body.error.details).toEqual([{ field: 'email', message: 'must be an e-mail address' }]);
  });

  it('locks an account after five wrong passwords with a message that says for how long', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'engineer');
    const { agent, token } = await csrfAgent();
    const attempt = (password: string) => agent.post('/api/auth/login').set('x-csrf-token', token).send({ email: user.email, password });
    for (let i = 0; i < 4; i += 1) expect((await attempt('wrong password!')).status).toBe(401);
    const locked = await attempt('wrong password!');
    expect(locked.status).toBe(429);
    expect(locked.body.error.message).toMatch(/locked after 5 failed sign-ins\. Try again in 15 minutes/);
    // Even the right password is refused while locked.
    expect((await attempt(TEST_PASSWORD)).status).toBe(429);
    await User.update({ lockedUntil: null }, { where: { id: user.id } });
  });

});

describe('CSRF', () => {
  it('refuses a state-changing request without the token', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'engineer');
    const session = await signIn(context.app, user);
    const response = await session.agent.post('/api/sites').send({ name: 'No token' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf');
    const wrong = await session.agent.post('/api/sites').set('x-csrf-token', 'x'.repeat(43)).send({ name: 'Wrong token' });
    expect(wrong.status).toBe(403);
  });
});

describe('session', () => {
  it('answers 401 when not signed in', async () => {
    const response = await request(context.app).get('/api/sites');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('not-signed-in');
  });

  it('signs out, after which the old cookie no longer works', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'approver');
    const session = await signIn(context.app, user);
    await session.post('/api/auth/logout').expect(204);
    await session.get('/api/auth/me').expect(401);
  });

  it('changes the password: the old one stops working, the new one works', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'viewer');
    const session = await signIn(context.app, user);
    const wrongCurrent = await session.post('/api/auth/password').send({ currentPassword: 'not it at all', newPassword: 'a brand new secret' });
    expect(wrongCurrent.status).toBe(400);
    expect(wrongCurrent.body.error.details[0].field).toBe('currentPassword');
    const short = await session.post('/api/auth/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'short' });
    expect(short.body.error.message).toBe('newPassword: must be at least 10 characters');
    await session.post('/api/auth/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'a brand new secret' }).expect(204);
    const { agent, token } = await csrfAgent();
    await agent.post('/api/auth/login').set('x-csrf-token', token).send({ email: user.email, password: TEST_PASSWORD }).expect(401);
    await agent.post('/api/auth/login').set('x-csrf-token', token).send({ email: user.email, password: 'a brand new secret' }).expect(200);
  });
});

describe('security headers', () => {
  it('sends a content security policy that allows only the app’s own assets', async () => {
    const response = await request(context.app).get('/api/health');
    const policy = String(response.headers['content-security-policy']);
    expect(policy).toContain("default-src 'self'");
    expect(policy).toContain("script-src 'self'");
    expect(policy).toContain("frame-ancestors 'none'");
    expect(policy).not.toContain('unsafe-eval');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.body).toEqual({ status: 'ok', database: 'up' });
  });

  it('compresses text answers for clients that accept it, but never the answers that carry the CSRF token', async () => {
    const { agent } = await csrfAgent();
    const big = await agent.get('/api/openapi.json').set('Accept-Encoding', 'gzip').expect(200);
    expect(big.headers['content-encoding']).toBe('gzip');
    expect(big.body.openapi).toMatch(/^3\./);
    const plain = await agent.get('/api/openapi.json').set('Accept-Encoding', 'identity').expect(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    const token = await agent.get('/api/auth/csrf').set('Accept-Encoding', 'gzip').expect(200);
    expect(token.headers['content-encoding']).toBeUndefined();
  });
});
