import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { commands } from '../../calc/commands.js';
import { AuditLog, Motor, type Organization, type Site } from '../../server/models/index.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, type TestContext } from '../support/api.js';

let context: TestContext;
let organization: Organization;
let other: Organization;

/** The same JSON `npm run calc -- assess` takes. */
const assessInput = {
  motor: { tag: 'AHU-3 supply fan', application: 'fan', ratedPowerKw: 15, poles: 4, efficiencyClass: 'IE1', controlMethod: 'outlet-damper', hoursPerYear: 6000, loadFactor: 0.8 },
  site: { name: 'Chiller plant', voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.18, demandChargePerKwMonth: 6, currency: 'EUR', co2KgPerKwh: 0.3 },
};

/** What the command line answers for an input (JSON round trip, as the API sends it). */
const commandLine = (input: unknown) => JSON.parse(JSON.stringify(commands.assess!.run(input)));

async function createMotor(organizationId: number, site: Site, overrides: Partial<Motor['_creationAttributes']> = {}) {
  return Motor.create({
    organizationId,
    siteId: site.id,
    tag: `M-${Math.random().toString(36).slice(2, 8)}`,
    description: null,
    area: 'Boiler house',
    application: 'pump',
    ratedPowerKw: 11,
    speedRpm: 1460,
    poles: 4,
    voltageV: 400,
    frequencyHz: 50,
    ratedCurrentA: null,
    efficiencyClass: 'IE1',
    nameplateEfficiencyPct: null,
    powerFactor: null,
    frame: null,
    enclosure: null,
    manufacturer: null,
    yearInstalled: 2004,
    controlMethod: 'throttle-valve',
    hoursPerYear: null,
    loadFactor: 0.8,
    dutyProfile: null,
    ...overrides,
  });
}

beforeAll(async () => {
  context = await startTestApp();
  organization = await createOrganization();
  other = await createOrganization();
});
afterAll(async () => context.close());

describe('quick studies', () => {
  it('stores and answers exactly what the assess command answers for the same input, plus the id', async () => {
    const engineer = await createUser(organization, 'engineer');
    const session = await signIn(context.app, engineer);
    const created = await session.post('/api/studies').send({ ...assessInput, name: 'AHU-3 damper study' });
    expect(created.status).toBe(201);
    const { id, ...result } = created.body;
    expect(id).toBeGreaterThan(0);
    expect(result).toEqual(commandLine(assessInput));
    const stored = await session.get(`/api/studies/${id}`).expect(200);
    expect(stored.body.input).toEqual(assessInput);
    expect(stored.body.result).toEqual(commandLine(stored.body.input));
    const recommended = result.options.find((option: { code: string }) => option.code === result.recommended.code);
    expect(stored.body).toMatchObject({ name: 'AHU-3 damper study', motorTag: 'AHU-3 supply fan', siteName: 'Chiller plant', recommendedCode: result.recommended.code, createdByName: 'Test engineer' });
    expect(stored.body.npv).toBe(recommended.npv);
    expect(stored.body.savingsCost).toBe(recommended.savingsCost);
    const list = await session.get('/api/studies?q=AHU-3').expect(200);
    expect(list.body.items.map((item: { id: number }) => item.id)).toContain(id);
    expect(list.body.items[0]).not.toHaveProperty('result');
    const audit = await AuditLog.findOne({ where: { entity: 'study', entityId: id } });
    expect(audit?.userId).toBe(engineer.id);
  });

  it('fills a missing price book and assumptions from the organisation’s settings, and the stored result still equals the command line’s', async () => {
    const organizationWithSettings = await createOrganization();
    const admin = await signIn(context.app, await createUser(organizationWithSettings, 'admin'));
    await admin.agent.put('/api/settings/assumptions').set('x-csrf-token', admin.token).send({ discountRatePct: 12, version: 0 }).expect(200);
    const created = await admin.post('/api/studies').send(assessInput).expect(201);
    const stored = await admin.get(`/api/studies/${created.body.id}`).expect(200);
    expect(stored.body.input.assumptions).toEqual({ discountRatePct: 12 });
    expect(stored.body.result.assumptions).toContainEqual({ what: 'discount rate [%/a]', value: 12, source: 'given' });
    expect(stored.body.result).toEqual(commandLine(stored.body.input));
    // Assumptions sent with the study win over the settings.
    const own = await admin.post('/api/studies').send({ ...assessInput, assumptions: { discountRatePct: 5 } }).expect(201);
    expect(own.body.assumptions).toContainEqual({ what: 'discount rate [%/a]', value: 5, source: 'given' });
  });

  it('names the field of invalid input, from the zod schema and from calc', async () => {
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const small = await session.post('/api/studies').send({ ...assessInput, motor: { ...assessInput.motor, ratedPowerKw: 0.05 } });
    expect(small.status).toBe(400);
    expect(small.body.error.message).toBe('motor.ratedPowerKw: must be between 0.12 and 1000');
    const currency = await session.post('/api/studies').send({ ...assessInput, priceBook: { currency: 'USD' } });
    expect(currency.status).toBe(400);
    expect(currency.body.error.message).toBe('priceBook.currency: must equal site.currency (EUR)');
    expect(currency.body.error.details).toEqual([{ field: 'priceBook.currency', message: 'must equal site.currency (EUR)' }]);
    const noPrice = await session.post('/api/studies').send({ motor: assessInput.motor, site: { currency: 'EUR' } });
    expect(noPrice.body.error.message).toBe('site.energyPricePerKwh: is required unless timeOfUse is given');
  });

  it('lets every role read, only engineers and admins write (403 otherwise)', async () => {
    const engineer = await signIn(context.app, await createUser(organization, 'engineer'));
    const study = await engineer.post('/api/studies').send(assessInput).expect(201);
    for (const role of ['viewer', 'approver'] as const) {
      const session = await signIn(context.app, await createUser(organization, role));
      expect((await session.post('/api/studies').send(assessInput)).status).toBe(403);
      expect((await session.delete(`/api/studies/${study.body.id}`)).status).toBe(403);
      await session.get(`/api/studies/${study.body.id}`).expect(200);
      await session.get('/api/studies').expect(200);
    }
    const admin = await signIn(context.app, await createUser(organization, 'admin'));
    await admin.delete(`/api/studies/${study.body.id}`).expect(204);
    await admin.get(`/api/studies/${study.body.id}`).expect(404);
  });

  it('answers 404 for another organisation’s study and motor', async () => {
    const foreign = await signIn(context.app, await createUser(other, 'engineer'));
    const study = await foreign.post('/api/studies').send(assessInput).expect(201);
    const foreignMotor = await createMotor(other.id, await createSite(other));
    const session = await signIn(context.app, await createUser(organization, 'admin'));
    await session.get(`/api/studies/${study.body.id}`).expect(404);
    await session.delete(`/api/studies/${study.body.id}`).expect(404);
    await session.post(`/api/studies/from-motor/${foreignMotor.id}`).expect(404);
    expect((await session.post('/api/studies').send({ ...assessInput, motorId: foreignMotor.id })).status).toBe(404);
    const list = await session.get('/api/studies?pageSize=500').expect(200);
    expect(list.body.items.map((item: { id: number }) => item.id)).not.toContain(study.body.id);
  });

  it('builds the input of a register motor from the motor, its site’s tariff and hours, and answers the result unsaved', async () => {
    const site = await createSite(organization);
    await site.update({ timeOfUse: [{ name: 'Peak', pricePerKwh: 0.24, shareOfHoursPct: 40 }, { name: 'Off-peak', pricePerKwh: 0.1, shareOfHoursPct: 60 }] });
    const motor = await createMotor(organization.id, site, { tag: 'P-101', dutyProfile: null, hoursPerYear: null });
    const session = await signIn(context.app, await createUser(organization, 'viewer'));
    const preview = await session.post(`/api/studies/from-motor/${motor.id}`).expect(200);
    expect(preview.body.input.motor).toMatchObject({ tag: 'P-101', application: 'pump', ratedPowerKw: 11, poles: 4, efficiencyClass: 'IE1', controlMethod: 'throttle-valve', loadFactor: 0.8, yearInstalled: 2004 });
    expect(preview.body.input.motor).not.toHaveProperty('hoursPerYear');
    expect(preview.body.input.site.timeOfUse).toEqual([
      { period: 'Peak', pricePerKwh: 0.24, hoursShare: 0.4 },
      { period: 'Off-peak', pricePerKwh: 0.1, hoursShare: 0.6 },
    ]);
    expect(preview.body.result).toEqual(commandLine(preview.body.input));
    expect(preview.body.result.assumptions).toContainEqual({ what: 'running hours [h/a]', value: 6000, source: "site's default hours" });
    expect(preview.body.bldcDesignId).toBeNull();
    const bldc = preview.body.result.options.find((option: { code: string }) => option.code === 'bldc');
    expect(bldc.assumptions[0].value).toBe('generic permanent-magnet part-load model at the IE5 level');
    // Nothing was saved.
    const list = await session.get(`/api/studies?motorId=${motor.id}`).expect(200);
    expect(list.body.total).toBe(0);
  });
});
