/**
 * What an API test needs: the app on the test database, the mail catcher on a free port, small
 * factories for organisations, users and sites, and signed-in supertest agents.
 */
import { randomBytes } from 'node:crypto';
import request from 'supertest';
import { inject } from 'vitest';
import { createApp } from '../../server/app.js';
import { loadConfig } from '../../server/lib/config.js';
import { connectDatabase, database } from '../../server/lib/database.js';
import { setLogLevel } from '../../server/lib/logger.js';
import { startMailCatcher, type MailCatcher } from '../../server/lib/mail-catcher.js';
import { createMailer } from '../../server/lib/mail.js';
import { startJobs, stopJobs } from '../../server/jobs/index.js';
import { hashPassword } from '../../server/lib/passwords.js';
import { Organization, OutboxMessage, Site, User } from '../../server/models/index.js';
import type { Role } from '../../server/shared/roles.js';

export const TEST_PASSWORD = 'correct horse battery';
let passwordHash: string | undefined;

export interface TestContext {
  app: ReturnType<typeof createApp>['app'];
  catcher: MailCatcher;
  close(): Promise<void>;
}

export async function startTestApp(options: { signInAttemptsPerWindow?: number } = {}): Promise<TestContext> {
  setLogLevel('silent');
  const url = inject('databaseUrl');
  connectDatabase(url, { poolMax: 5 });
  const catcher = await startMailCatcher(0);
  const config = { ...loadConfig({ NODE_ENV: 'test', SESSION_SECRET: 'test-secret-test-secret' }), publicUrl: 'http://127.0.0.1:3000' };
  const mailer = createMailer({ catcherPort: catcher.port, from: config.mailFrom });
  const { app, close } = createApp({ config, databaseUrl: url, mailer, ...options });
  // The job runner, polling every half second (jobs enqueued in this process start at once).
  await startJobs({ pollMs: 500 });
  return {
    app,
    catcher,
    async close() {
      await stopJobs();
      mailer.close();
      await catcher.close();
      await close();
      await database().close();
    },
  };
}

const unique = () => randomBytes(4).toString('hex');

export async function createOrganization(name = `Test Works ${unique()}`): Promise<Organization> {
  return Organization.create({ name, slug: `test-${unique()}` });
}

export async function createUser(organization: Organization, role: Role, overrides: Partial<{ email: string; status: 'active' | 'disabled' }> = {}) {
  passwordHash ??= await hashPassword(TEST_PASSWORD);
  return User.create({
    organizationId: organization.id,
    email: overrides.email ?? `${role}-${unique()}@test.example`,
    name: `Test ${role}`,
    role,
    status: overrides.status ?? 'active',
    passwordHash,
  });
}

/** A site of the organisation with plain figures (400 V, 50 Hz, 0.15 EUR/kWh); the benches make theirs with it too. */
export async function createSite(organization: Organization, overrides: Partial<{ name: string }> = {}): Promise<Site> {
  return Site.create({
    organizationId: organization.id,
    name: overrides.name ?? `Pump house ${unique()}`,
    code: null,
    location: null,
    voltageV: 400,
    frequencyHz: 50,
    energyPricePerKwh: '0.15',
    demandChargePerKwMonth: '5',
    currency: 'EUR',
    co2KgPerKwh: 0.25,
    defaultHoursPerYear: 6000,
  });
}

/** A supertest agent that keeps cookies, signed in as `user`, with its CSRF token. */
export async function signIn(app: TestContext['app'], user: User) {
  const agent = request.agent(app);
  const csrf = await agent.get('/api/auth/csrf').expect(200);
  const login = await agent
    .post('/api/auth/login')
    .set('x-csrf-token', csrf.body.token as string)
    .send({ email: user.email, password: TEST_PASSWORD })
    .expect(200);
  const token = login.body.csrfToken as string;
  return {
    agent,
    token,
    get: (path: string) => agent.get(path),
    post: (path: string) => agent.post(path).set('x-csrf-token', token),
    patch: (path: string) => agent.patch(path).set('x-csrf-token', token),
    delete: (path: string) => agent.delete(path).set('x-csrf-token', token),
  };
}

/** Waits until the mail catcher has stored a message matching `predicate` (SMTP is asynchronous). */
export async function waitForMail(predicate: (message: OutboxMessage) => boolean, timeoutMs = 5000): Promise<OutboxMessage> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const found = (await OutboxMessage.findAll({ order: [['id', 'DESC']], limit: 50 })).find(predicate);
    if (found) return found;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error('no matching e-mail reached the mail catcher');
}
