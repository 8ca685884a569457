import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { OutboxMessage, User, type Organization } from '../../server/models/index.js';
import { createOrganization, createUser, signIn, startTestApp, waitForMail, type TestContext } from '../support/api.js';

let context: TestContext;
let organization: Organization;

beforeAll(async () => {
  context = await startTestApp();
  organization = await createOrganization('Invitation Works');
});
afterAll(async () => context.close());

describe('team invitations', () => {
  it('e-mails an invitation through SMTP to the catcher; the link signs the new user in', async () => {
    const admin = await signIn(context.app, await createUser(organization, 'admin'));
    const invited = await admin.post('/api/users/invitations').send({ email: 'new.Engineer@Test.example', role: 'engineer' });
    expect(invited.status).toBe(201);
    expect(invited.body).toMatchObject({ email: 'new.engineer@test.example', role: 'engineer', status: 'invited' });

    const mail = await waitForMail((message) => message.toAddresses.includes('new.engineer@test.example'));
    expect(mail.organizationId).toBe(organization.id);
    expect(mail.subject).toContain('Invitation Works');
    const token = /invitation\?token=([\w-]+)/.exec(mail.textBody)?.[1];
    expect(token).toBeDefined();

    const agent = request.agent(context.app);
    const csrf = (await agent.get('/api/auth/csrf')).body.token as string;
    const accepted = await agent
      .post('/api/auth/invitations/accept')
      .set('x-csrf-token', csrf)
      .send({ token, name: 'Nadia Okafor', password: 'a long enough secret' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({ name: 'Nadia Okafor', role: 'engineer' });
    await agent.get('/api/auth/me').expect(200);

    // A token works once.
    const again = await agent
      .post('/api/auth/invitations/accept')
      .set('x-csrf-token', accepted.body.csrfToken as string)
      .send({ token, name: 'Someone Else', password: 'another long secret' });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('invalid-invitation');
  });

  it('refuses an e-mail that already has an account with 409 naming the field', async () => {
    const existing = await createUser(organization, 'viewer');
    const admin = await signIn(context.app, await createUser(organization, 'admin'));
    const response = await admin.post('/api/users/invitations').send({ email: existing.email, role: 'viewer' });
    expect(response.status).toBe(409);
    expect(response.body.error.details[0].field).toBe('email');
  });

  it('lets only admins see or change the team', async () => {
    for (const role of ['engineer', 'approver', 'viewer'] as const) {
      const session = await signIn(context.app, await createUser(organization, role));
      await session.get('/api/users').expect(403);
      await session.post('/api/users/invitations').send({ email: `x-${role}@test.example`, role: 'viewer' }).expect(403);
    }
  });

  it('changes a role with optimistic locking, and disabling signs the user out everywhere', async () => {
    const admin = await signIn(context.app, await createUser(organization, 'admin'));
    const target = await createUser(organization, 'viewer');
    const targetSession = await signIn(context.app, target);
    const changed = await admin.patch(`/api/users/${target.id}`).send({ role: 'approver', version: 0 });
    expect(changed.status).toBe(200);
    expect(changed.body.role).toBe('approver');
    await admin.patch(`/api/users/${target.id}`).send({ role: 'engineer', version: 0 }).expect(409);
    await admin.patch(`/api/users/${target.id}`).send({ status: 'disabled', version: 1 }).expect(200);
    await targetSession.get('/api/auth/me').expect(401);
    expect((await User.findByPk(target.id))?.status).toBe('disabled');
  });

  it('keeps an admin from demoting themself', async () => {
    const adminUser = await createUser(organization, 'admin');
    const admin = await signIn(context.app, adminUser);
    const response = await admin.patch(`/api/users/${adminUser.id}`).send({ role: 'viewer', version: 0 });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('own-account');
  });

  it('does not show one organisation’s users to another', async () => {
    const elsewhere = await createOrganization();
    const foreignUser = await createUser(elsewhere, 'viewer');
    const admin = await signIn(context.app, await createUser(organization, 'admin'));
    const list = await admin.get('/api/users?pageSize=500').expect(200);
    expect(list.body.items.map((user: { id: number }) => user.id)).not.toContain(foreignUser.id);
    await admin.patch(`/api/users/${foreignUser.id}`).send({ role: 'admin', version: 0 }).expect(404);
  });
});

describe('outbox', () => {
  it('lists caught mail with attachments for the organisation only, and serves attachments as downloads', async () => {
    const admin = await createUser(organization, 'admin');
    const session = await signIn(context.app, admin);
    const { createMailer } = await import('../../server/lib/mail.js');
    const mailer = createMailer({ catcherPort: context.catcher.port, from: 'Statorline <test@statorline.localhost>' });
    const elsewhere = await createOrganization();
    await mailer.send({
      organizationId: organization.id,
      to: ['plant.manager@test.example'],
      subject: 'Pump house savings summary',
      text: 'See the attached figures.',
      attachments: [{ filename: 'figures.csv', content: Buffer.from('kWh,saved\n1200,300\n'), contentType: 'text/csv' }],
    });
    await mailer.send({ organizationId: elsewhere.id, to: ['someone@test.example'], subject: 'Not for you', text: 'Private.' });
    mailer.close();
    await waitForMail((message) => message.subject === 'Not for you');
    await waitForMail((message) => message.subject === 'Pump house savings summary');

    const list = await session.get('/api/outbox?q=savings').expect(200);
    expect(list.body.total).toBe(1);
    const message = list.body.items[0];
    expect(message).toMatchObject({ subject: 'Pump house savings summary', to: ['plant.manager@test.example'] });
    expect(message.attachments).toEqual([expect.objectContaining({ filename: 'figures.csv', contentType: 'text/csv', sizeBytes: Buffer.byteLength('kWh,saved\n1200,300\n') })]);
    const all = await session.get('/api/outbox?pageSize=500').expect(200);
    expect(all.body.items.map((m: { subject: string }) => m.subject)).not.toContain('Not for you');

    const download = await session.get(`/api/outbox/${message.id}/attachments/${message.attachments[0].id}`).expect(200);
    expect(download.headers['content-disposition']).toBe('attachment; filename="figures.csv"');
    expect(download.text).toBe('kWh,saved\n1200,300\n');

    const foreign = await OutboxMessage.findOne({ where: { subject: 'Not for you' } });
    await session.get(`/api/outbox/${foreign?.id}`).expect(404);
  });

  it('is closed to viewers', async () => {
    const session = await signIn(context.app, await createUser(organization, 'viewer'));
    await session.get('/api/outbox').expect(403);
  });
});
