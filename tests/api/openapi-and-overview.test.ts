import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assess } from '../../calc/assess/assess.js';
import type { AssumptionsInput, MotorInput, PriceBookInput, SiteInput } from '../../calc/assess/schema.js';
import { sumMoney } from '../../calc/economics/money.js';
import { CalcInputError } from '../../calc/errors.js';
import { registerInputs } from '../../server/cases/inputs.js';
import { Motor, Site } from '../../server/models/index.js';
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

  it('gives energy today and the savings identified as assess gives them motor by motor, and counts the motors it cannot assess', async () => {
    // The Overview screens the register in batches (calc's screenMotors); the oracle here is assess,
    // one motor at a time, on the same stored inputs (common practice, no source: two paths, one answer).
    const organization = await createOrganization();
    const north = await createSite(organization, { name: 'North works' });
    const south = await createSite(organization, { name: 'South works' });
    const base = { organizationId: organization.id, poles: 4, voltageV: 400, frequencyHz: 50, description: null, area: null, speedRpm: 1460, ratedCurrentA: null, nameplateEfficiencyPct: null, powerFactor: null, frame: null, enclosure: null, manufacturer: null, yearInstalled: null, hoursPerYear: 6000, loadFactor: 0.7, dutyProfile: null, efficiencyClass: 'IE1' as const, controlMethod: 'direct-on-line' as const };
    await Motor.create({ ...base, siteId: north.id, tag: 'N-F-1', application: 'fan', ratedPowerKw: 45, controlMethod: 'outlet-damper' });
    await Motor.create({ ...base, siteId: north.id, tag: 'N-P-1', application: 'pump', ratedPowerKw: 15, controlMethod: 'throttle-valve', efficiencyClass: 'unknown' });
    await Motor.create({ ...base, siteId: north.id, tag: 'N-C-1', application: 'conveyor', ratedPowerKw: 5.5, hoursPerYear: 2000 });
    // Runs more hours than a year has: stored (an old import), but assess refuses it.
    await Motor.create({ ...base, siteId: north.id, tag: 'N-X-1', application: 'compressor', ratedPowerKw: 22, hoursPerYear: 9000 });
    await Motor.create({ ...base, siteId: south.id, tag: 'S-F-1', application: 'fan', ratedPowerKw: 90, controlMethod: 'inlet-vanes', efficiencyClass: 'IE2' });
    await Motor.create({ ...base, siteId: south.id, tag: 'S-P-1', application: 'pump', ratedPowerKw: 4, efficiencyClass: 'IE3', hoursPerYear: 800 });

    const sites = await Site.findAll({ where: { organizationId: organization.id }, order: [['id', 'ASC']] });
    const inputs = await registerInputs(organization.id, sites);
    const expected = new Map(sites.map((site) => [site.id, { kwh: 0, cost: [] as number[], co2: 0, unassessed: 0, savedKwh: 0, savedCost: [] as number[], motors: 0 }]));
    for (const motor of inputs.motors) {
      const sums = expected.get(motor.siteId)!;
      const siteInput = inputs.sites.find((site) => site.id === motor.siteId)!.input as SiteInput;
      try {
        const result = assess(motor.input as MotorInput, siteInput, (inputs.priceBook ?? undefined) as PriceBookInput | undefined, (inputs.assumptions ?? undefined) as AssumptionsInput | undefined, { detail: 'totals' });
        sums.kwh += result.baseline.annualKwh;
        sums.cost.push(result.baseline.annualCost);
        sums.co2 += result.baseline.annualCo2Kg;
        const pick = result.options.find((option) => option.code === result.recommended.code)!;
        if (pick.code !== 'keep') {
          sums.savedKwh += pick.savingsKwh;
          sums.savedCost.push(pick.savingsCost);
          sums.motors += 1;
        }
      } catch (error) {
        if (!(error instanceof CalcInputError)) throw error;
        sums.unassessed += 1;
      }
    }
    expect(expected.get(north.id)!.unassessed).toBe(1);
    expect(expected.get(north.id)!.motors).toBeGreaterThan(0);

    const session = await signIn(context.app, await createUser(organization, 'viewer'));
    const response = await session.get('/api/overview').expect(200);
    for (const site of [north, south]) {
      const sums = expected.get(site.id)!;
      const row = response.body.sites.find((entry: { id: number }) => entry.id === site.id);
      expect(row.figures).toMatchObject({
        energyTodayKwh: Math.round(sums.kwh * 10) / 10,
        energyCostToday: sumMoney(sums.cost),
        co2TodayKg: Math.round(sums.co2 * 10) / 10,
        unassessedMotors: sums.unassessed,
        identified: { kwh: Math.round(sums.savedKwh * 10) / 10, cost: sumMoney(sums.savedCost), motors: sums.motors, source: 'assessment' },
      });
    }
  });
});
