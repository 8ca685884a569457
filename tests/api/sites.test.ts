import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditLog, type Organization } from '../../server/models/index.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, type TestContext } from '../support/api.js';

let context: TestContext;
let organization: Organization;
let other: Organization;

const validSite = {
  name: 'Chiller plant',
  voltageV: 400,
  frequencyHz: 50,
  energyPricePerKwh: 0.1725,
  demandChargePerKwMonth: 7.25,
  currency: 'EUR',
  co2KgPerKwh: 0.21,
  defaultHoursPerYear: 7000,
};

beforeAll(async () => {
  context = await startTestApp();
  organization = await createOrganization();
  other = await createOrganization();
});
afterAll(async () => context.close());

describe('sites', () => {
  it('lets an engineer create a site, keeps money exact, and records who did it', async () => {
    const engineer = await createUser(organization, 'engineer');
    const session = await signIn(context.app, engineer);
    const created = await session.post('/api/sites').send({
      ...validSite,
      timeOfUse: [
        { name: 'Peak', pricePerKwh: 0.21, shareOfHoursPct: 40 },
        { name: 'Off-peak', pricePerKwh: 0.12, shareOfHoursPct: 60 },
      ],
    });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Chiller plant', energyPricePerKwh: 0.1725, demandChargePerKwMonth: 7.25, version: 0, archived: false });
    const audit = await AuditLog.findOne({ where: { entity: 'site', entityId: created.body.id } });
    expect(audit?.userId).toBe(engineer.id);
    expect(audit?.action).toBe('create');
  });

  it('names the field and the rule of invalid input', async () => {
    const session = await signIn(context.app, await createUser(organization, 'admin'));
    const response = await session.post('/api/sites').send({ ...validSite, frequencyHz: 55 });
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe('frequencyHz: must be 50 or 60');
    const hours = await session.post('/api/sites').send({ ...validSite, defaultHoursPerYear: 9000 });
    expect(hours.body.error.details[0]).toEqual({ field: 'defaultHoursPerYear', message: 'must be at most 8760 h (one year)' });
    const bands = await session.post('/api/sites').send({ ...validSite, timeOfUse: [{ name: 'Day', pricePerKwh: 0.2, shareOfHoursPct: 50 }] });
    expect(bands.body.error.message).toBe('timeOfUse: shares of hours must add up to 100 %');
  });

  it('refuses a viewer’s and an approver’s write with 403', async () => {
    for (const role of ['viewer', 'approver'] as const) {
      const session = await signIn(context.app, await createUser(organization, role));
      const response = await session.post('/api/sites').send(validSite);
      expect(response.status).toBe(403);
      expect(response.body.error.code).toBe('forbidden');
      await session.get('/api/sites').expect(200);
    }
  });

  it('answers 404 for another organisation’s site, to read or to write', async () => {
    const foreign = await createSite(other, { name: 'Not yours' });
    const session = await signIn(context.app, await createUser(organization, 'admin'));
    await session.get(`/api/sites/${foreign.id}`).expect(404);
    const write = await session.patch(`/api/sites/${foreign.id}`).send({ name: 'Taken', version: 0 });
    expect(write.status).toBe(404);
    const list = await session.get('/api/sites?pageSize=500&archived=include');
    expect(list.body.items.map((site: { id: number }) => site.id)).not.toContain(foreign.id);
  });

  it('pages, sorts and filters the list', async () => {
    const organizationForList = await createOrganization();
    for (const name of ['Alpha mill', 'Bravo mill', 'Charlie yard', 'Delta mill']) await createSite(organizationForList, { name });
    const session = await signIn(context.app, await createUser(organizationForList, 'viewer'));
    const page = await session.get('/api/sites?page=2&pageSize=2&sort=-name').expect(200);
    expect(page.body).toMatchObject({ total: 4, page: 2, pageSize: 2 });
    expect(page.body.items.map((site: { name: string }) => site.name)).toEqual(['Bravo mill', 'Alpha mill']);
    const filtered = await session.get('/api/sites?q=mill&sort=name').expect(200);
    expect(filtered.body.total).toBe(3);
    const badSort = await session.get('/api/sites?sort=password');
    expect(badSort.status).toBe(400);
    expect(badSort.body.error.details[0].field).toBe('sort');
  });

  it('refuses an edit made on a stale version with 409, never overwriting', async () => {
    const site = await createSite(organization, { name: 'Boiler house' });
    const first = await signIn(context.app, await createUser(organization, 'engineer'));
    const second = await signIn(context.app, await createUser(organization, 'engineer'));
    await first.patch(`/api/sites/${site.id}`).send({ name: 'Boiler house A', version: 0 }).expect(200);
    const stale = await second.patch(`/api/sites/${site.id}`).send({ name: 'Boiler house B', version: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale-version');
    const current = await first.get(`/api/sites/${site.id}`).expect(200);
    expect(current.body).toMatchObject({ name: 'Boiler house A', version: 1 });
  });

  it('archives and restores a site; archived sites leave the default list', async () => {
    const site = await createSite(organization, { name: 'Old press shop' });
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const archived = await session.patch(`/api/sites/${site.id}`).send({ archived: true, version: 0 }).expect(200);
    expect(archived.body.archived).toBe(true);
    const list = await session.get('/api/sites?pageSize=500').expect(200);
    expect(list.body.items.map((s: { id: number }) => s.id)).not.toContain(site.id);
    const restored = await session.patch(`/api/sites/${site.id}`).send({ archived: false, version: 1 }).expect(200);
    expect(restored.body.archived).toBe(false);
  });
});
