import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Job, Motor, type Organization, type Site } from '../../server/models/index.js';
import { solveBudgetKnapsack, type KnapsackOption } from '../../server/screening/knapsack.js';
import { createOrganization, createSite, createUser, signIn, startTestApp, type TestContext } from '../support/api.js';

let context: TestContext;
let organization: Organization;
let other: Organization;
let site: Site;

type Session = Awaited<ReturnType<typeof signIn>>;

async function createMotor(organizationId: number, onSite: Site, overrides: Partial<Motor['_creationAttributes']> = {}) {
  return Motor.create({
    organizationId,
    siteId: onSite.id,
    tag: `M-${Math.random().toString(36).slice(2, 8)}`,
    description: null,
    area: 'Process',
    application: 'pump',
    ratedPowerKw: 11,
    speedRpm: null,
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
    yearInstalled: null,
    controlMethod: 'direct-on-line',
    hoursPerYear: 6000,
    loadFactor: 0.8,
    dutyProfile: null,
    ...overrides,
  });
}

async function waitForJob(session: Session, jobId: number, timeoutMs = 20_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const response = await session.get(`/api/jobs/${jobId}`).expect(200);
    if (!['queued', 'running'].includes(response.body.status)) return response.body;
    if (Date.now() > deadline) throw new Error(`job ${jobId} still ${response.body.status}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/** The best total value within the budget by trying every combination (at most one option per item). */
function bruteForce(items: KnapsackOption[][], budget: number): number {
  let best = 0;
  const visit = (index: number, capex: number, value: number) => {
    if (capex > budget + 1e-9) return;
    if (index === items.length) {
      best = Math.max(best, value);
      return;
    }
    visit(index + 1, capex, value);
    for (const option of items[index]!) visit(index + 1, capex + option.capex, value + option.value);
  };
  visit(0, 0, 0);
  return Math.round(best * 100) / 100;
}

/** A small deterministic pseudo-random generator (LCG, Numerical Recipes constants). */
function lcg(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

beforeAll(async () => {
  context = await startTestApp();
  organization = await createOrganization();
  other = await createOrganization();
  site = await createSite(organization, { name: 'Wastewater works' });
  // Five motors with different options that pay: fans and pumps on throttling (speed control pays),
  // old motors on direct-on-line duty, and one small, seldom-run motor where nothing pays.
  await createMotor(organization.id, site, { tag: 'FAN-1', application: 'fan', ratedPowerKw: 30, controlMethod: 'outlet-damper', area: 'Aeration' });
  await createMotor(organization.id, site, { tag: 'FAN-2', application: 'fan', ratedPowerKw: 11, controlMethod: 'inlet-vanes', area: 'Aeration' });
  await createMotor(organization.id, site, { tag: 'PMP-1', application: 'pump', ratedPowerKw: 22, controlMethod: 'throttle-valve', area: 'Intake' });
  await createMotor(organization.id, site, { tag: 'CNV-1', application: 'conveyor', ratedPowerKw: 7.5, rewinds: 2, area: 'Sludge' });
  await createMotor(organization.id, site, { tag: 'MIX-1', application: 'mixer', ratedPowerKw: 0.75, hoursPerYear: 200, efficiencyClass: 'IE3', area: 'Sludge' });
  await createMotor(organization.id, site, { tag: 'OLD-1', status: 'retired' });
});
afterAll(async () => context.close());

describe('budget knapsack', () => {
  it('finds the same best total NPV as brute force on small cases, never over the budget', () => {
    const random = lcg(20261201);
    for (let trial = 0; trial < 300; trial += 1) {
      const items: KnapsackOption[][] = Array.from({ length: 1 + Math.floor(random() * 6) }, () =>
        Array.from({ length: Math.floor(random() * 4) }, () => ({
          capex: Math.round(random() * 500_000) / 100,
          value: Math.round((random() * 1.2 - 0.2) * 800_000) / 100,
        })),
      );
      const budget = Math.round(random() * 8_000 * 100) / 100;
      const solution = solveBudgetKnapsack(items, budget);
      expect(solution.exact).toBe(true);
      expect(solution.totalValue).toBeCloseTo(bruteForce(items, budget), 6);
      const picked = solution.picks.flatMap((pick, index) => (pick === null ? [] : [items[index]![pick]!]));
      expect(picked.reduce((sum, option) => sum + option.capex, 0)).toBeLessThanOrEqual(budget + 1e-9);
      expect(picked.every((option) => option.value > 0)).toBe(true);
      expect(solution.totalCapex).toBeCloseTo(picked.reduce((sum, option) => sum + option.capex, 0), 6);
    }
  });

  it('stays within the budget and close to the optimum when the frontier is merged', () => {
    const random = lcg(7);
    const items = Array.from({ length: 12 }, () => Array.from({ length: 3 }, () => ({ capex: Math.round(random() * 300_000) / 100, value: Math.round(random() * 500_000) / 100 })));
    const budget = 9_000;
    const exact = solveBudgetKnapsack(items, budget);
    const merged = solveBudgetKnapsack(items, budget, 20);
    expect(exact.exact).toBe(true);
    expect(merged.exact).toBe(false);
    expect(merged.totalCapex).toBeLessThanOrEqual(budget);
    expect(merged.totalValue).toBeLessThanOrEqual(exact.totalValue);
    expect(merged.totalValue).toBeGreaterThan(0.9 * exact.totalValue);
  });
});

describe('site screening', () => {
  it('runs as a job to done and, under a budget, selects the set of highest total NPV (checked by brute force)', async () => {
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const free = await session.post(`/api/sites/${site.id}/screening`).send({});
    expect(free.status).toBe(202);
    const unlimited = await waitForJob(session, free.body.jobId);
    expect(unlimited).toMatchObject({ status: 'done', progress: 1, error: null, kind: 'screening' });
    const rows = unlimited.result.rows as Array<{ tag: string; selected: boolean; capex: number; npv: number; optionCode: string | null; candidates: Array<{ code: string; capex: number; npv: number }> }>;
    expect(rows.map((row) => row.tag).sort()).toEqual(['CNV-1', 'FAN-1', 'FAN-2', 'MIX-1', 'PMP-1']);
    expect(unlimited.result.motorCount).toBe(5);
    // Without a budget every motor with an option that pays is selected, at its best NPV.
    for (const row of rows) {
      expect(row.selected).toBe(row.candidates.length > 0);
      if (row.optionCode) expect(row.npv).toBe(Math.max(...row.candidates.map((candidate) => candidate.npv)));
    }
    const npvs = rows.filter((row) => row.optionCode).map((row) => row.npv);
    expect(npvs).toEqual([...npvs].sort((a, b) => b - a));
    expect(rows.find((row) => row.tag === 'MIX-1')?.optionCode).toBeNull();

    // A budget of 40 % of the unconstrained capex binds.
    const budget = Math.round(0.4 * unlimited.result.totals.capex);
    const started = await session.post(`/api/sites/${site.id}/screening`).send({ budget, rankBy: 'payback' }).expect(202);
    const limited = await waitForJob(session, started.body.jobId);
    expect(limited.status).toBe('done');
    const limitedRows = limited.result.rows as typeof rows;
    const items = limitedRows.map((row) => row.candidates.map((candidate) => ({ capex: candidate.capex, value: candidate.npv })));
    expect(limited.result.totals.capex).toBeLessThanOrEqual(budget);
    expect(limited.result.totals.npv).toBeCloseTo(bruteForce(items, budget), 2);
    const selected = limitedRows.filter((row) => row.selected);
    expect(limited.result.totals.npv).toBeCloseTo(selected.reduce((sum, row) => sum + row.npv, 0), 2);
    expect(limited.result.totals.motors).toBe(selected.length);
    expect(limited.result.selection.exact).toBe(true);
    const paybacks = limitedRows.filter((row) => row.optionCode).map((row) => (row as unknown as { paybackYears: number }).paybackYears);
    expect(paybacks).toEqual([...paybacks].sort((a, b) => a - b));
  });

  it('screens only the motors matching the filters', async () => {
    const session = await signIn(context.app, await createUser(organization, 'admin'));
    const started = await session.post(`/api/sites/${site.id}/screening`).send({ filters: { application: 'fan', minKw: 15 } }).expect(202);
    const job = await waitForJob(session, started.body.jobId);
    expect(job.result.rows.map((row: { tag: string }) => row.tag)).toEqual(['FAN-1']);
    const area = await session.post(`/api/sites/${site.id}/screening`).send({ filters: { area: 'Sludge', application: ['conveyor', 'mixer'] } }).expect(202);
    expect((await waitForJob(session, area.body.jobId)).result.rows.map((row: { tag: string }) => row.tag).sort()).toEqual(['CNV-1', 'MIX-1']);
  });

  it('turns selected rows into retrofit proposals once, and lists them', async () => {
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const started = await session.post(`/api/sites/${site.id}/screening`).send({}).expect(202);
    const job = await waitForJob(session, started.body.jobId);
    const chosen = job.result.rows.filter((row: { selected: boolean }) => row.selected).slice(0, 2);
    const motorIds = chosen.map((row: { motorId: number }) => row.motorId);
    const first = await session.post(`/api/screenings/${job.id}/proposals`).send({ motorIds });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ created: 2, alreadyProposed: 0 });
    expect(first.body.items[0]).toMatchObject({ status: 'proposed', source: 'screening', jobId: job.id, siteId: site.id, currency: 'EUR' });
    const row = chosen.find((entry: { motorId: number }) => entry.motorId === first.body.items[0].motorId);
    expect(first.body.items[0]).toMatchObject({ optionCode: row.optionCode, capex: row.capex, npv: row.npv, predictedSavingsCost: row.costSaved, predictedSavingsKwh: row.annualKwhSaved });
    const again = await session.post(`/api/screenings/${job.id}/proposals`).send({ motorIds }).expect(201);
    expect(again.body).toMatchObject({ created: 0, alreadyProposed: 2 });
    const list = await session.get(`/api/retrofits?siteId=${site.id}&status=proposed`).expect(200);
    expect(list.body.items.filter((item: { jobId: number }) => item.jobId === job.id)).toHaveLength(2);
    const mixer = job.result.rows.find((entry: { tag: string }) => entry.tag === 'MIX-1');
    const refused = await session.post(`/api/screenings/${job.id}/proposals`).send({ motorIds: [mixer.motorId] });
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toBe('motorIds.0: motor MIX-1 has no option that pays');
    const stranger = await session.post(`/api/screenings/${job.id}/proposals`).send({ motorIds: [999999] });
    expect(stranger.body.error.details[0]).toEqual({ field: 'motorIds.0', message: 'is not in this screening' });
  });

  it('names the field of invalid input', async () => {
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    const budget = await session.post(`/api/sites/${site.id}/screening`).send({ budget: -5 });
    expect(budget.status).toBe(400);
    expect(budget.body.error.message).toBe('budget: must be positive');
    const rank = await session.post(`/api/sites/${site.id}/screening`).send({ rankBy: 'cost' });
    expect(rank.body.error.message).toBe('rankBy: must be npv or payback');
    const range = await session.post(`/api/sites/${site.id}/screening`).send({ filters: { minKw: 20, maxKw: 10 } });
    expect(range.body.error.message).toBe('filters.maxKw: must be at least minKw');
    const empty = await session.post('/api/screenings/1/proposals').send({ motorIds: [] });
    expect(empty.body.error.message).toBe('motorIds: needs at least one motor');
  });

  it('refuses a viewer’s and an approver’s screening or proposal with 403; they read jobs and retrofits', async () => {
    const engineer = await signIn(context.app, await createUser(organization, 'engineer'));
    const started = await engineer.post(`/api/sites/${site.id}/screening`).send({}).expect(202);
    await waitForJob(engineer, started.body.jobId);
    for (const role of ['viewer', 'approver'] as const) {
      const session = await signIn(context.app, await createUser(organization, role));
      expect((await session.post(`/api/sites/${site.id}/screening`).send({})).status).toBe(403);
      expect((await session.post(`/api/screenings/${started.body.jobId}/proposals`).send({ motorIds: [1] })).status).toBe(403);
      expect((await session.post(`/api/jobs/${started.body.jobId}/cancel`)).status).toBe(403);
      await session.get(`/api/jobs/${started.body.jobId}`).expect(200);
      await session.get('/api/retrofits').expect(200);
    }
  });

  it('answers 404 for another organisation’s site, job and proposals', async () => {
    const foreignSite = await createSite(other);
    const foreign = await signIn(context.app, await createUser(other, 'engineer'));
    const foreignJob = await foreign.post(`/api/sites/${foreignSite.id}/screening`).send({}).expect(202);
    await waitForJob(foreign, foreignJob.body.jobId);
    const session = await signIn(context.app, await createUser(organization, 'admin'));
    await session.post(`/api/sites/${foreignSite.id}/screening`).send({}).expect(404);
    await session.get(`/api/jobs/${foreignJob.body.jobId}`).expect(404);
    await session.post(`/api/jobs/${foreignJob.body.jobId}/cancel`).expect(404);
    await session.post(`/api/screenings/${foreignJob.body.jobId}/proposals`).send({ motorIds: [1] }).expect(404);
  });

  it('cancels a queued job, and re-runs a job left running by a dead process', async () => {
    const session = await signIn(context.app, await createUser(organization, 'engineer'));
    // A kind no runner handles stays queued, so the cancel is deterministic.
    const idle = await Job.create({ organizationId: organization.id, kind: 'not-handled-here', params: {}, createdBy: null });
    const cancelled = await session.post(`/api/jobs/${idle.id}/cancel`).expect(200);
    expect(cancelled.body.status).toBe('cancelled');
    expect((await session.post(`/api/jobs/${idle.id}/cancel`)).status).toBe(409);
    // A screening "running" on a process whose heartbeat stopped ten minutes ago.
    const orphan = await Job.create({
      organizationId: organization.id,
      kind: 'screening',
      status: 'running',
      progress: 0.3,
      attempts: 1,
      lockedBy: 'dead-host:1:abc',
      heartbeatAt: new Date(Date.now() - 10 * 60_000),
      params: { siteId: site.id, rankBy: 'npv' },
      createdBy: null,
    });
    const finished = await waitForJob(session, orphan.id);
    expect(finished).toMatchObject({ status: 'done', progress: 1 });
    expect((await Job.findByPk(orphan.id))?.attempts).toBe(2);
  });
});
