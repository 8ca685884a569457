import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { commands } from '../../calc/commands.js';
import { Motor, type Organization, type Site } from '../../server/models/index.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, type TestContext } from '../support/api.js';

let context: TestContext;
let organization: Organization;
let other: Organization;
let site: Site;
let motor: Motor;
let designId: number;
let designResult: Record<string, unknown>;

/** The README's size-bldc example: 4 kW, 1500 rpm, 18 slots / 12 poles (feasible). */
const sizeInput = { ratedPowerKw: 4, speedRpm: 1500, supplyVoltageV: 400, frequencyHz: 50, slots: 18, poles: 12, objective: 'efficiency' };

async function createMotor(organizationId: number, onSite: Site, overrides: Partial<Motor['_creationAttributes']> = {}) {
  return Motor.create({
    organizationId,
    siteId: onSite.id,
    tag: `M-${Math.random().toString(36).slice(2, 8)}`,
    description: null,
    area: null,
    application: 'fan',
    ratedPowerKw: 4,
    speedRpm: 1440,
    poles: 4,
    voltageV: 400,
    frequencyHz: 50,
    ratedCurrentA: null,
    efficiencyClass: 'IE1',
    nameplateEfficiencyPct: null,
    powerFactor: null,
    frame: '112M',
    enclosure: null,
    manufacturer: null,
    yearInstalled: null,
    controlMethod: 'outlet-damper',
    hoursPerYear: 7000,
    loadFactor: 0.8,
    dutyProfile: null,
    ...overrides,
  });
}

beforeAll(async () => {
  context = await startTestApp();
  organization = await createOrganization();
  other = await createOrganization();
  site = await createSite(organization);
  motor = await createMotor(organization.id, site, { tag: 'EF-7' });
  const engineer = await signIn(context.app, await createUser(organization, 'engineer'));
  const created = await engineer.post('/api/designs').send({ ...sizeInput, motorId: motor.id });
  expect(created.status).toBe(201);
  const { id, appliedDefaults: _applied, ...result } = created.body;
  designId = id;
  designResult = result;
}, 120_000);
afterAll(async () => context.close());

describe('BLDC designs', () => {
  it('sizes in a worker, stores input and result, and defaults the minimum efficiency to IE4', async () => {
    const session = await signIn(context.app, await createUser(organization, 'viewer'));
    const stored = await session.get(`/api/designs/${designId}`).expect(200);
    // IE4, 4 kW, 4 poles (the linked motor's), 50 Hz: 91.1 % in IEC 60034-30-1:2014 Table 3; calc/efficiency gives it.
    const ie4 = (commands['efficiency-class']!.run({ ratedPowerKw: 4, poles: 4, frequencyHz: 50, efficiencyClass: 'IE4' }) as { efficiencyPct: number }).efficiencyPct;
    expect(ie4).toBe(91.1);
    expect(stored.body.input).toEqual({ ...sizeInput, minEfficiencyPct: ie4 });
    expect(stored.body.appliedDefaults[0]).toMatch(/^minEfficiencyPct 91\.1 %: IE4 of a 4 kW 4-pole 50 Hz motor/);
    expect(stored.body.result).toEqual(designResult);
    expect(stored.body).toMatchObject({ name: 'BLDC for EF-7', motorId: motor.id, motorTag: 'EF-7', feasible: true, slots: 18, poles: 12, frame: '112M' });
    expect(stored.body.efficiencyPct).toBeGreaterThanOrEqual(ie4);
    // The command line gives the same design for the stored input.
    expect(JSON.parse(JSON.stringify(commands['size-bldc']!.run(stored.body.input)))).toEqual(designResult);
    const list = await session.get('/api/designs').expect(200);
    const item = list.body.items.find((entry: { id: number }) => entry.id === designId);
    expect(item).toMatchObject({ feasible: true, slots: 18, poles: 12, frame: '112M', ratedPowerKw: 4 });
    expect(item).not.toHaveProperty('result');
  });

  it('simulates the design in a worker and answers a summary with bounded series', async () => {
    const session = await signIn(context.app, await createUser(organization, 'viewer'));
    const ratedTorqueNm = designResult.ratedTorqueNm as number;
    const response = await session
      .post(`/api/designs/${designId}/simulate`)
      .send({ load: { kind: 'quadratic', torqueNm: ratedTorqueNm, atSpeedRpm: 1500 }, setSpeedRpm: 1500, durationS: 0.05, stepS: 5e-6, outputPoints: 100 });
    expect(response.status).toBe(200);
    expect(response.body.summary.finalSpeedRpm).toBeGreaterThan(0);
    expect(response.body.summary.peakPhaseCurrentA).toBeGreaterThan(0);
    expect(response.body.series.timeS.length).toBeLessThanOrEqual(101);
    expect(response.body.series.speedRpm.length).toBe(response.body.series.timeS.length);
    const tooMany = await session.post(`/api/designs/${designId}/simulate`).send({ load: { kind: 'constant', torqueNm: 1 }, durationS: 0.01, outputPoints: 5000 });
    expect(tooMany.body.error.message).toBe('outputPoints: must be at most 2000');
    const bad = await session.post(`/api/designs/${designId}/simulate`).send({ load: { kind: 'constant', torqueNm: 1 }, durationS: -1 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toBe('durationS: must be positive');
  });

  it('answers the efficiency map and a sweep', async () => {
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const map = await session.post(`/api/designs/${designId}/efficiency-map`).send({ speedsRpm: [500, 1500], torquesNm: [5, 20] }).expect(200);
    expect(map.body.efficiencyPct).toHaveLength(2);
    expect(map.body.efficiencyPct[0]).toHaveLength(2);
    expect(map.body.best.efficiencyPct).toBeGreaterThan(50);
    const sweep = await session
      .post('/api/designs/sweep')
      .send({ base: { ratedPowerKw: 4, speedRpm: 1500, supplyVoltageV: 400, slots: 18, poles: 12 }, parameter: 'targets.magnetTemperatureC', from: 60, to: 120, steps: 2 });
    expect(sweep.status).toBe(200);
    expect(sweep.body.rows.map((row: { value: number }) => row.value)).toEqual([60, 120]);
    const badSweep = await session.post('/api/designs/sweep').send({ base: { ratedPowerKw: -4, speedRpm: 1500, supplyVoltageV: 400 }, parameter: 'speedRpm', from: 1000, to: 1500, steps: 2 });
    expect(badSweep.status).toBe(400);
    expect(badSweep.body.error.message).toBe('base.ratedPowerKw: must be positive');
  });

  it('links the design to the motor; then the BLDC options of its studies and screenings use the design’s curve', async () => {
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const linked = await session.post(`/api/motors/${motor.id}/design`).send({ designId });
    expect(linked.status).toBe(200);
    expect(linked.body).toMatchObject({ motorId: motor.id, designId });
    const preview = await session.post(`/api/studies/from-motor/${motor.id}`).expect(200);
    expect(preview.body.bldcDesignId).toBe(designId);
    const bldc = preview.body.result.options.find((option: { code: string }) => option.code === 'bldc');
    expect(bldc.assumptions[0].what).toBe('BLDC model');
    expect(bldc.assumptions[0].source).toMatch(new RegExp(`^given curve: BLDC design #${designId} "BLDC for EF-7"`));
    expect(preview.body.result).toEqual(JSON.parse(JSON.stringify(commands.assess!.run(preview.body.input))));
    const started = await session.post(`/api/sites/${site.id}/screening`).send({}).expect(202);
    let job;
    for (let tries = 0; tries < 200; tries += 1) {
      job = (await session.get(`/api/jobs/${started.body.jobId}`)).body;
      if (job.status === 'done' || job.status === 'failed') break;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    expect(job.status).toBe('done');
    expect(job.result.rows.find((row: { motorId: number }) => row.motorId === motor.id).usesBldcDesign).toBe(true);
    const list = await session.get('/api/designs').expect(200);
    expect(list.body.items.find((entry: { id: number }) => entry.id === designId).linkedMotorIds).toEqual([motor.id]);
    // A stale motor version is refused; unlinking restores the generic model.
    expect((await session.post(`/api/motors/${motor.id}/design`).send({ designId: null, version: 0 })).status).toBe(409);
    await session.post(`/api/motors/${motor.id}/design`).send({ designId: null, version: linked.body.version }).expect(200);
    expect((await session.post(`/api/studies/from-motor/${motor.id}`).expect(200)).body.bldcDesignId).toBeNull();
  });

  it('refuses to link a design rated unlike the motor', async () => {
    const big = await createMotor(organization.id, site, { ratedPowerKw: 45 });
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const response = await session.post(`/api/motors/${big.id}/design`).send({ designId });
    expect(response.status).toBe(400);
    expect(response.body.error.details[0]).toEqual({ field: 'designId', message: 'rating differs from the motor’s by more than 10 %' });
  });

  it('names the field of invalid input', async () => {
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const negative = await session.post('/api/designs').send({ ...sizeInput, ratedPowerKw: -1 });
    expect(negative.status).toBe(400);
    expect(negative.body.error.message).toBe('ratedPowerKw: must be positive');
    const unknown = await session.post('/api/designs').send({ ...sizeInput, magnet: 'unobtainium' });
    expect(unknown.body.error.message).toBe('magnet: must be a grade of the material library');
    const map = await session.post(`/api/designs/${designId}/efficiency-map`).send({ speedsRpm: [], torquesNm: [1] });
    expect(map.body.error.message).toBe('speedsRpm: needs at least one speed');
  });

  it('refuses a viewer’s and an approver’s design or link with 403', async () => {
    for (const role of ['viewer', 'approver'] as const) {
      const session = await signIn(context.app, await createUser(organization, role));
      expect((await session.post('/api/designs').send(sizeInput)).status).toBe(403);
      expect((await session.post(`/api/motors/${motor.id}/design`).send({ designId })).status).toBe(403);
      await session.get(`/api/designs/${designId}`).expect(200);
    }
  });

  it('answers 404 for another organisation’s design and motor', async () => {
    const foreignMotor = await createMotor(other.id, await createSite(other));
    const session = await signIn(context.app, await createUser(other, 'admin'));
    await session.get(`/api/designs/${designId}`).expect(404);
    await session.post(`/api/designs/${designId}/simulate`).send({ load: { kind: 'constant', torqueNm: 1 }, durationS: 0.01 }).expect(404);
    await session.post(`/api/designs/${designId}/efficiency-map`).send({ speedsRpm: [1000], torquesNm: [1] }).expect(404);
    await session.post(`/api/motors/${foreignMotor.id}/design`).send({ designId }).expect(404);
    await session.post(`/api/motors/${motor.id}/design`).send({ designId: null }).expect(404);
    expect((await session.post('/api/designs').send({ ...sizeInput, motorId: motor.id })).status).toBe(404);
    const list = await session.get('/api/designs').expect(200);
    expect(list.body.items.map((item: { id: number }) => item.id)).not.toContain(designId);
  });
});
