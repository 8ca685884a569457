/**
 * Sessions (issue 10): the session id is renewed at sign-in, the cookie flags, "sign out everywhere",
 * and a password change ending the user's other sessions. Sign-in lockout, the rate limit and CSRF
 * are covered by auth.test.ts and sign-in-rate-limit.test.ts.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createApp } from '../../server/app.js';
import { loadConfig } from '../../server/lib/config.js';
import { createMailer } from '../../server/lib/mail.js';
import { database } from '../../server/lib/database.js';
import { createOrganization, createUser, signIn, startTestApp, TEST_PASSWORD, type TestContext } from '../support/api.js';

let context: TestContext;
beforeAll(async () => {
  context = await startTestApp();
});
afterAll(async () => context.close());

/** The value of the statorline.sid cookie a response sets (undefined when none). */
function sessionCookie(response: request.Response): string | undefined {
  const cookies = ([] as string[]).concat((response.headers['set-cookie'] as string[] | string | undefined) ?? []);
  return cookies.find((cookie) => cookie.startsWith('statorline.sid='));
}
const sidOf = (cookie: string | undefined) => cookie?.split(';')[0];

async function storedSessions(userId: number): Promise<number> {
  const [rows] = await database().query(`SELECT count(*)::int AS n FROM "session" WHERE (sess -> 'passport' ->> 'user') = :user`, {
    replacements: { user: String(userId) },
  });
  return (rows as Array<{ n: number }>)[0]!.n;
}

describe('session id and cookie', () => {
  it('gives a new session id at sign-in and forgets the one used before it', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'engineer');
    const anonymous = await request(context.app).get('/api/auth/csrf').expect(200);
    const before = sidOf(sessionCookie(anonymous));
    expect(before).toMatch(/^statorline\.sid=/);
    const login = await request(context.app)
      .post('/api/auth/login')
      .set('Cookie', before!)
      .set('x-csrf-token', anonymous.body.token as string)
      .send({ email: user.email, password: TEST_PASSWORD })
      .expect(200);
    const after = sidOf(sessionCookie(login));
    expect(after).toMatch(/^statorline\.sid=/);
    expect(after).not.toBe(before);
    // A new CSRF token comes with the new session, and the pre-sign-in id is not signed in (fixation).
    expect(login.body.csrfToken).not.toBe(anonymous.body.token);
    await request(context.app).get('/api/auth/me').set('Cookie', after!).expect(200);
    await request(context.app).get('/api/auth/me').set('Cookie', before!).expect(401);
  });

  it('sets HttpOnly, SameSite=Lax, Path=/ and an expiry; Secure over HTTPS through the trusted local proxy, not over plain HTTP', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'viewer');
    const plain = await request(context.app).get('/api/auth/csrf').expect(200);
    const cookie = sessionCookie(plain)!;
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; SameSite=Lax/);
    expect(cookie).toMatch(/; Path=\//);
    expect(cookie).toMatch(/; Expires=/);
    expect(cookie).not.toMatch(/; Secure/);
    // Behind a TLS-terminating proxy on the same machine (TRUST_PROXY=loopback, COOKIE_SECURE=auto).
    // (supertest's cookie jar keeps Secure cookies off plain HTTP, so the cookie goes by hand.)
    const csrf = await request(context.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https').expect(200);
    expect(sessionCookie(csrf)).toMatch(/; Secure/);
    const login = await request(context.app)
      .post('/api/auth/login')
      .set('X-Forwarded-Proto', 'https')
      .set('Cookie', sidOf(sessionCookie(csrf))!)
      .set('x-csrf-token', csrf.body.token as string)
      .send({ email: user.email, password: TEST_PASSWORD })
      .expect(200);
    const signedIn = sessionCookie(login)!;
    expect(signedIn).toMatch(/; Secure/);
    expect(signedIn).toMatch(/; HttpOnly/);
  });

  it('honours COOKIE_SECURE=true and TRUST_PROXY=false', async () => {
    const config = { ...loadConfig({ NODE_ENV: 'test', SESSION_SECRET: 'test-secret-test-secret', COOKIE_SECURE: 'true', TRUST_PROXY: 'false' }), publicUrl: 'http://127.0.0.1:3000' };
    expect(config.trustProxy).toBe(false);
    const mailer = createMailer({ catcherPort: context.catcher.port, from: config.mailFrom });
    const { app, close } = createApp({ config, databaseUrl: inject('databaseUrl'), mailer });
    try {
      // Secure cookies are only sent over HTTPS; express-session withholds them on a plain request.
      const plain = await request(app).get('/api/auth/csrf').expect(200);
      expect(sessionCookie(plain)).toBeUndefined();
      // An untrusted X-Forwarded-Proto does not make the request secure either.
      const forwarded = await request(app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https').expect(200);
      expect(sessionCookie(forwarded)).toBeUndefined();
    } finally {
      mailer.close();
      await close();
    }
    expect(loadConfig({ TRUST_PROXY: '2' }).trustProxy).toBe(2);
    expect(loadConfig({}).cookieSecure).toBe('auto');
    expect(() => loadConfig({ COOKIE_SECURE: 'yes' })).toThrow(/COOKIE_SECURE/);
  });
});

describe('sign out everywhere', () => {
  it('ends the sessions of every browser of the user, and only that user’s', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'engineer');
    const colleague = await createUser(organization, 'engineer');
    const office = await signIn(context.app, user);
    const tablet = await signIn(context.app, user);
    const other = await signIn(context.app, colleague);
    await tablet.get('/api/auth/me').expect(200);
    expect(await storedSessions(user.id)).toBe(2);

    await office.post('/api/auth/logout-everywhere').expect(204);
    await office.get('/api/auth/me').expect(401);
    await tablet.get('/api/auth/me').expect(401);
    expect((await tablet.post('/api/sites').send({ name: 'After sign-out' })).status).toBeGreaterThanOrEqual(401);
    expect(await storedSessions(user.id)).toBe(0);
    // Someone else's session is untouched.
    await other.get('/api/auth/me').expect(200);
    expect(await storedSessions(colleague.id)).toBe(1);
    // Signing in again works.
    const again = await signIn(context.app, user);
    await again.get('/api/auth/me').expect(200);
  });

  it('needs a signed-in session and the CSRF token', async () => {
    await request(context.app).post('/api/auth/logout-everywhere').expect(403);
    const organization = await createOrganization();
    const user = await createUser(organization, 'viewer');
    const session = await signIn(context.app, user);
    const refused = await session.agent.post('/api/auth/logout-everywhere');
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('csrf');
    await session.get('/api/auth/me').expect(200);
    const anonymous = request.agent(context.app);
    const token = (await anonymous.get('/api/auth/csrf')).body.token as string;
    await anonymous.post('/api/auth/logout-everywhere').set('x-csrf-token', token).expect(401);
  });
});

describe('password change', () => {
  it('ends the user’s other sessions and keeps the one that changed it', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'approver');
    const here = await signIn(context.app, user);
    const elsewhere = await signIn(context.app, user);
    await elsewhere.get('/api/auth/me').expect(200);
    await here.post('/api/auth/password').send({ currentPassword: TEST_PASSWORD, newPassword: 'a brand new passphrase' }).expect(204);
    await here.get('/api/auth/me').expect(200);
    await elsewhere.get('/api/auth/me').expect(401);
    expect(await storedSessions(user.id)).toBe(1);
  });

  it('a wrong current password ends nothing', async () => {
    const organization = await createOrganization();
    const user = await createUser(organization, 'viewer');
    const here = await signIn(context.app, user);
    const elsewhere = await signIn(context.app, user);
    await here.post('/api/auth/password').send({ currentPassword: 'not the password', newPassword: 'a brand new passphrase' }).expect(400);
    await elsewhere.get('/api/auth/me').expect(200);
  });
});
