import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Motor } from '../../server/models/index.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, type TestContext } from '../support/api.js';

let context: TestContext;
beforeAll(async () => {
  context = await startTestApp();
});
afterAll(async () => context.close());

describe('OpenAPI document', () => {
  it('describes every route with its schemas, generated from the zod schemas', async () => {
    const response = await request(context.app).get('/api/openapi.json').expect(200);
    const document = response.body;
    expect(document.openapi).toBe('3.1.0');
    for (const path of ['/api/auth/login', '/api/auth/me', '/api/auth/csrf', '/api/auth/logout', '/api/sites', '/api/sites/{id}', '/api/users', '/api/outbox', '/api/health']) {
      expect(document.paths, path).toHaveProperty([path]);
    }
    const createSite = document.paths['/api/sites'].post;
    expect(createSite.requestBody.content['application/json'].schema.required).toContain('voltageV');
    expect(createSite['x-roles']).toEqual(['admin', 'engineer']);
    const listParameters = document.paths['/api/sites'].get.parameters.map((parameter: { name: string }) => parameter.name);
    expect(listParameters).toEqual(expect.arrayContaining(['page', 'pageSize', 'sort', 'q']));
  });

  it('answers an unknown API path with 404 in the one error format', async () => {
    const response = await request(context.app).get('/api/no-such-thing');
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not-found');
  });
});

describe('overview', () => {
  it('counts sites, motors in service and installed kW of the organisation only', async () => {
    const organization = await createOrganization();
    const site = await createSite(organization, { name: 'Cooling towers' });
    const base = { organizationId: organization.id, siteId: site.id, poles: 4, voltageV: 400, frequencyHz: 50, description: null, area: null, speedRpm: 1460, ratedCurrentA: null, nameplateEfficiencyPct: null, powerFactor: null, frame: null, enclosure: null, manufacturer: null, yearInstalled: null, hoursPerYear: 6000, loadFactor: 0.7, dutyProfile: null, efficiencyClass: 'IE2' as const, controlMethod: 'direct-on-line' as const };
    await Motor.create({ ...base, tag: 'CT-F-1', application: 'fan', ratedPowerKw: 11 });
    await Motor.create({ ...base, tag: 'CT-P-1', application: 'pump', ratedPowerKw: 7.5 });
    await Motor.create({ ...base, tag: 'CT-P-2', application: 'pump', ratedPowerKw: 30, status: 'retired' });
    const other = await createOrganization();
    await createSite(other);
    const session = await signIn(context.app, await createUser(organization, 'viewer'));
    const response = await session.get('/api/overview').expect(200);
    expect(response.body.totals).toEqual({ sites: 1, motors: 2, installedKw: 18.5 });
    expect(response.body.byApplication).toEqual([
      { application: 'fan', motors: 1, installedKw: 11 },
      { application: 'pump', motors: 1, installedKw: 7.5 },
    ]);
  });
});
