import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { setUploadDir } from '../../server/lib/uploads.js';
import { Retrofit, type Motor, type Organization, type Site, type User } from '../../server/models/index.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, waitForMail, type TestContext } from '../support/api.js';
import { createMotor, createRetrofitRow, uploadMeter } from '../support/retrofits.js';

let context: TestContext;
let organization: Organization;
let other: Organization;
let site: Site;
let otherSite: Site;
let engineer: User;
let approver: User;
let admin: User;
let viewer: User;
let uploadDir: string;

beforeAll(async () => {
  context = await startTestApp();
  uploadDir = mkdtempSync(join(tmpdir(), 'statorline-retrofits-'));
  setUploadDir(uploadDir);
  organization = await createOrganization();
  other = await createOrganization();
  site = await createSite(organization);
  otherSite = await createSite(organization);
  engineer = await createUser(organization, 'engineer');
  approver = await createUser(organization, 'approver');
  admin = await createUser(organization, 'admin');
  viewer = await createUser(organization, 'viewer');
});
afterAll(async () => {
  await context.close();
  rmSync(uploadDir, { recursive: true, force: true });
});

const hourly = (day: string, values: number[]) => ['timestamp,Power [kW]', ...values.map((kw, hour) => `${day} ${String(hour).padStart(2, '0')}:00,${kw}`)].join('\n');

describe('the workflow', () => {
  let motor: Motor;
  beforeAll(async () => {
    motor = await createMotor(organization, site, { tag: 'CW-PUMP-7' });
  });

  it('takes an engineer’s proposal, records it and e-mails the approvers', async () => {
    const session = await signIn(context.app, engineer);
    const created = await session.post('/api/retrofits').send({ motorId: motor.id, optionCode: 'ie4', predictedSavingsKwh: 8000, capex: 3500, comment: 'Runs 6000 h at 80 % load' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ status: 'proposed', source: 'manual', motorTag: 'CW-PUMP-7', siteId: site.id, predictedSavingsKwh: 8000, capex: 3500, currency: 'EUR', overdue: false, allowedTransitions: [] });
    expect(created.body.events).toEqual([expect.objectContaining({ fromStatus: null, toStatus: 'proposed', userId: engineer.id, comment: 'Runs 6000 h at 80 % load' })]);
    const mail = await waitForMail((message) => message.toAddresses.includes(approver.email.toLowerCase()) && message.subject.includes('CW-PUMP-7'));
    expect(mail.subject).toBe(`Retrofit proposed: CW-PUMP-7 (ie4) at ${site.name}`);
    expect(mail.textBody).toContain(`/retrofits/${created.body.id}`);
    const again = await session.post('/api/retrofits').send({ motorId: motor.id, optionCode: 'bldc' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('retrofit-open');
    const bad = await session.post('/api/retrofits').send({ motorId: motor.id, optionCode: 'keep' });
    expect(bad.body.error.message).toBe('optionCode: must be a retrofit option code such as ie4 or bldc-vsd');
  });

  it('refuses a transition the role may not make with 403 and one the workflow does not allow with 409', async () => {
    const row = await createRetrofitRow(organization, await createMotor(organization, site), engineer.id);
    const asEngineer = await signIn(context.app, engineer);
    const asApprover = await signIn(context.app, approver);
    const asAdmin = await signIn(context.app, admin);
    const asViewer = await signIn(context.app, viewer);
    for (const session of [asEngineer, asAdmin]) {
      const refused = await session.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'approved' });
      expect(refused.status).toBe(403);
      expect(refused.body.error.message).toBe('Only approvers may move a retrofit to approved.');
    }
    expect((await asViewer.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'approved' })).status).toBe(403);
    expect((await asViewer.post('/api/retrofits').send({ motorId: row.motorId, optionCode: 'ie4' })).status).toBe(403);
    expect((await asApprover.post('/api/retrofits').send({ motorId: row.motorId, optionCode: 'ie4' })).status).toBe(403);
    const skip = await asEngineer.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'installed' });
    expect(skip.status).toBe(409);
    expect(skip.body.error).toMatchObject({ code: 'transition-not-allowed', message: 'A retrofit cannot go from proposed to installed; from proposed it can go to approved or rejected.' });
    const approverOrders = await asApprover.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'ordered' });
    expect(approverOrders.status).toBe(403);
    const approverEdits = await asApprover.patch(`/api/retrofits/${row.id}`).send({ version: 0, notes: 'x' });
    expect(approverEdits.status).toBe(403);
    const noComment = await asApprover.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'rejected' });
    expect(noComment.body.error.message).toBe('comment: is required when rejecting');

    const approved = await asApprover.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'approved', comment: 'Go ahead' });
    expect(approved.status).toBe(200);
    expect(approved.body).toMatchObject({ status: 'approved', version: 1 });
    const mail = await waitForMail((message) => message.toAddresses.includes(engineer.email.toLowerCase()) && message.subject.startsWith('Retrofit approved'));
    expect(mail.textBody).toContain('Comment: Go ahead');
    const stale = await asApprover.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'rejected', comment: 'Budget cut' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale-version');
    const rejected = await asApprover.patch(`/api/retrofits/${row.id}`).send({ version: 1, status: 'rejected', comment: 'Budget cut' });
    expect(rejected.body).toMatchObject({ status: 'rejected', allowedTransitions: [] });
    const reopen = await asEngineer.patch(`/api/retrofits/${row.id}`).send({ version: 2, status: 'ordered' });
    expect(reopen.status).toBe(409);
    expect(reopen.body.error.message).toBe('A retrofit cannot go from rejected to ordered; from rejected it can go to nothing (final).');
    const closed = await asEngineer.patch(`/api/retrofits/${row.id}`).send({ version: 2, actualCapex: 100 });
    expect(closed.body.error.code).toBe('retrofit-closed');
    await asEngineer.patch(`/api/retrofits/${row.id}`).send({ version: 2, notes: 'Re-propose next year' }).expect(200);
  });

  it('runs an approved retrofit to verified: order, installation data, meter data, frozen savings, e-mails', async () => {
    const row = await createRetrofitRow(organization, await createMotor(organization, site, { tag: 'AER-FAN-2' }), engineer.id, { status: 'approved', predictedSavingsKwh: 10_000 });
    const session = await signIn(context.app, engineer);
    const ordered = await session.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'ordered', expectedInstallationDate: '2026-01-10', comment: 'PO 4711' });
    expect(ordered.status).toBe(200);
    expect(ordered.body).toMatchObject({ status: 'ordered', orderDate: new Date().toISOString().slice(0, 10), overdue: true, overdueReason: 'installation was due on 2026-01-10', allowedTransitions: ['installed'] });
    const overdueList = await session.get(`/api/retrofits?overdue=true&siteId=${site.id}`).expect(200);
    expect(overdueList.body.items.map((item: { id: number }) => item.id)).toContain(row.id);
    const early = await session.patch(`/api/retrofits/${row.id}`).send({ version: 1, status: 'verified' });
    expect(early.status).toBe(409);
    const installed = await session.patch(`/api/retrofits/${row.id}`).send({
      version: 1,
      status: 'installed',
      installationDate: '2026-05-20',
      actualCapex: 4200.5,
      rebateReceived: 600,
      installedEquipment: { installedBy: 'Ridgeway Electrical', motor: { type: 'IE4 induction', ratedPowerKw: 18.5, efficiencyPct: 94.2, frame: '180M' }, drive: { type: 'VSD', ratedPowerKw: 22, efficiencyPct: 97.5 } },
    });
    expect(installed.status).toBe(200);
    expect(installed.body).toMatchObject({ status: 'installed', installationDate: '2026-05-20', actualCapex: 4200.5, rebateReceived: 600, overdue: false, installedEquipment: { installedBy: 'Ridgeway Electrical', motor: { frame: '180M' } } });
    await waitForMail((message) => message.toAddresses.includes(approver.email.toLowerCase()) && message.subject === `Retrofit recorded as installed: AER-FAN-2 (ie4) at ${site.name}`);
    const notYet = await session.patch(`/api/retrofits/${row.id}`).send({ version: 2, status: 'verified' });
    expect(notYet.status).toBe(409);
    expect(notYet.body.error).toMatchObject({ code: 'verification-incomplete', message: 'The savings cannot be verified yet: missing baseline meter data; reporting meter data.' });
    // The worked example of meter-data.test.ts: 11 500 kWh/yr verified against 10 000 predicted.
    await uploadMeter(session, row.id, 'baseline', hourly('2026-03-02', [19, 21, 20, 20, 19, 21, 20, 20, 0.5, 0.5, 0.5, 0.5])).expect(201);
    await uploadMeter(session, row.id, 'reporting', hourly('2026-06-01', [17, 19, 18, 18, 17, 19, 0.5, 0.5, 0.5, 0.5])).expect(201);
    const verified = await session.patch(`/api/retrofits/${row.id}`).send({ version: 2, status: 'verified', comment: 'M&V report attached' });
    expect(verified.status).toBe(200);
    expect(verified.body).toMatchObject({ status: 'verified', verifiedSavingsKwh: 11_500 });
    expect(verified.body.verifiedUncertaintyKwh).toBeCloseTo(4838.2, 0);
    expect(verified.body.events.map((event: { toStatus: string }) => event.toStatus)).toEqual(['ordered', 'installed', 'verified']);
    await waitForMail((message) => message.toAddresses.includes(approver.email.toLowerCase()) && message.subject.startsWith('Retrofit verified: AER-FAN-2'));
    const closedData = await uploadMeter(session, row.id, 'reporting', hourly('2026-06-02', [5, 5]));
    expect(closedData.body.error.code).toBe('retrofit-closed');

    const summary = (await session.get(`/api/retrofits/verification-summary?siteId=${site.id}`).expect(200)).body;
    expect(summary.sites).toHaveLength(1);
    expect(summary.sites[0]).toMatchObject({ siteId: site.id, verifiable: 1, verifiedSavingsKwh: 11_500, predictedOfVerifiedKwh: 10_000, realisedPct: 115 });
    const whole = (await session.get('/api/retrofits/verification-summary').expect(200)).body;
    expect(whole.organization.verifiedSavingsKwh).toBeGreaterThanOrEqual(11_500);
    expect(whole.sites.map((entry: { siteId: number }) => entry.siteId)).toEqual(expect.arrayContaining([site.id, otherSite.id]));
  });

  it('flags a proposal waiting too long and lists with the status and site filters', async () => {
    const waiting = await createRetrofitRow(organization, await createMotor(organization, otherSite), engineer.id);
    await Retrofit.update({ statusChangedAt: new Date(Date.now() - 45 * 86_400_000) }, { where: { id: waiting.id } });
    const session = await signIn(context.app, viewer);
    const list = (await session.get(`/api/retrofits?siteId=${otherSite.id}&status=proposed`).expect(200)).body;
    expect(list.total).toBe(1);
    expect(list.items[0]).toMatchObject({ id: waiting.id, overdue: true, overdueReason: 'waiting 45 days for a decision (more than 30)' });
    const notOverdue = (await session.get(`/api/retrofits?siteId=${otherSite.id}&overdue=false`).expect(200)).body;
    expect(notOverdue.items.map((item: { id: number }) => item.id)).not.toContain(waiting.id);
    const bad = await session.get('/api/retrofits?status=done');
    expect(bad.status).toBe(400);
  });
});

describe('documents and photos', () => {
  it('stores images and PDFs recognised from their content and refuses anything else', async () => {
    const row = await createRetrofitRow(organization, await createMotor(organization, site), engineer.id, { status: 'installed' });
    const session = await signIn(context.app, engineer);
    const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64, 3)]);
    const photo = await session.post(`/api/retrofits/${row.id}/files`).field('kind', 'photo').attach('file', png, { filename: '../new "motor".png', contentType: 'text/html' });
    expect(photo.status).toBe(201);
    expect(photo.body).toMatchObject({ kind: 'photo', contentType: 'image/png', fileName: 'new motor.png', sizeBytes: png.length });
    const pdf = await session.post(`/api/retrofits/${row.id}/files`).field('kind', 'document').attach('file', Buffer.from('%PDF-1.4\n%%EOF'), 'commissioning.pdf');
    expect(pdf.status).toBe(201);
    const html = await session.post(`/api/retrofits/${row.id}/files`).attach('file', Buffer.from('<html><script>alert(1)</script></html>'), 'sheet.pdf');
    expect(html.status).toBe(415);
    const pdfAsPhoto = await session.post(`/api/retrofits/${row.id}/files`).field('kind', 'photo').attach('file', Buffer.from('%PDF-1.4\n%%EOF'), 'x.pdf');
    expect(pdfAsPhoto.body.error.message).toBe('file: a photo must be an image');
    const download = await session.get(`/api/retrofits/${row.id}/files/${photo.body.id}`).expect(200);
    expect(download.headers['content-type']).toBe('image/png');
    expect(download.headers['x-content-type-options']).toBe('nosniff');
    expect(download.headers['content-disposition']).toContain('attachment');
    const listed = (await session.get(`/api/retrofits/${row.id}/files`).expect(200)).body;
    expect(listed.items).toHaveLength(2);
    const viewerSession = await signIn(context.app, viewer);
    expect((await viewerSession.post(`/api/retrofits/${row.id}/files`).attach('file', png, 'a.png')).status).toBe(403);
  });
});

describe('organisation isolation', () => {
  it('answers 404 for another organisation’s retrofit on every route, and for its motor on a proposal', async () => {
    const row = await createRetrofitRow(organization, await createMotor(organization, site), engineer.id, { status: 'installed' });
    const stranger = await signIn(context.app, await createUser(other, 'engineer'));
    const strangerAdmin = await signIn(context.app, await createUser(other, 'approver'));
    expect((await stranger.get(`/api/retrofits/${row.id}`)).status).toBe(404);
    expect((await stranger.patch(`/api/retrofits/${row.id}`).send({ version: 0, notes: 'x' })).status).toBe(404);
    expect((await stranger.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'verified' })).status).toBe(404);
    expect((await strangerAdmin.patch(`/api/retrofits/${row.id}`).send({ version: 0, status: 'approved' })).status).toBe(404);
    expect((await uploadMeter(stranger, row.id, 'baseline', hourly('2026-03-02', [5, 5, 5]))).status).toBe(404);
    expect((await stranger.get(`/api/retrofits/${row.id}/meter-data`)).status).toBe(404);
    expect((await stranger.get(`/api/retrofits/${row.id}/verification`)).status).toBe(404);
    expect((await stranger.get(`/api/retrofits/${row.id}/files`)).status).toBe(404);
    expect((await stranger.post(`/api/retrofits/${row.id}/files`).attach('file', Buffer.from('%PDF-1.4\n%%EOF'), 'x.pdf')).status).toBe(404);
    expect((await stranger.get(`/api/retrofits/${row.id}/files/1`)).status).toBe(404);
    expect((await stranger.get(`/api/retrofits/verification-summary?siteId=${site.id}`)).status).toBe(404);
    expect((await stranger.post('/api/retrofits').send({ motorId: row.motorId, optionCode: 'ie4' })).status).toBe(404);
    const list = (await stranger.get('/api/retrofits').expect(200)).body;
    expect(list.items.map((item: { id: number }) => item.id)).not.toContain(row.id);
  });
});
