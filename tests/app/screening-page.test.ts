import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import ScreeningPage from 'pages/ScreeningPage.vue';
import type { JobOutput, ScreeningResult, ScreeningRow } from 'shared/screening';
import { totalsOf } from 'composables/useScreening';
import { createHarness, fakeFetch, flushPromises, mountInLayout } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const site = { id: 1, name: 'Kestrel Valley Dairy', currency: 'EUR', timeOfUse: [] };

function row(motorId: number, selected: boolean, figures: Partial<ScreeningRow> = {}): ScreeningRow {
  return {
    rank: motorId,
    motorId,
    tag: `D-P-${100 + motorId}`,
    area: 'Packing',
    application: 'pump',
    ratedPowerKw: 15,
    optionCode: 'ie4',
    optionLabel: 'New IE4 motor',
    recommendedCode: 'ie4',
    annualKwhSaved: 1000.1 * motorId,
    costSaved: 150.55 * motorId,
    co2SavedKg: 300,
    kvaFreed: 0.4,
    lineCurrentFreedA: 0.6,
    capex: 1000.1,
    paybackYears: 2.4,
    npv: 1200.3,
    irr: 0.31,
    selected,
    usesBldcDesign: false,
    candidates: [],
    ...figures,
  };
}

const rows = [row(1, true), row(2, true), row(3, false), row(4, false, { optionCode: null, optionLabel: null, npv: 0, capex: 0 })];
const result: ScreeningResult = {
  siteId: 1,
  siteName: site.name,
  currency: 'EUR',
  budget: 2500,
  rankBy: 'npv',
  filters: {},
  motorCount: 4,
  failed: [],
  rows,
  totals: { motors: 2, annualKwhSaved: 3000.3, costSaved: 451.65, co2SavedKg: 600, kvaFreed: 0.8, capex: 2000.2, npv: 2400.6 },
  selection: { method: 'multiple-choice knapsack', exact: true },
};

function job(status: JobOutput['status'], progress: number): JobOutput {
  return {
    id: 42,
    kind: 'screening',
    status,
    progress,
    result: status === 'done' ? result : null,
    error: null,
    params: {},
    createdById: 7,
    createdAt: '2026-12-01T10:00:00Z',
    startedAt: null,
    finishedAt: null,
  };
}

describe('ScreeningPage', { timeout: 20_000 }, () => {
  it('starts a screening with the budget, follows its progress to 100 % and shows the budget’s totals', async () => {
    const answers = [job('running', 0.4), job('done', 1)];
    const { calls } = fakeFetch({
      'GET /api/sites': { body: { items: [site], total: 1, page: 1, pageSize: 100 } },
      'POST /api/sites/1/screening': { status: 202, body: { jobId: 42 } },
      'GET /api/jobs/42': () => ({ body: answers.length > 1 ? answers.shift() : answers[0] }),
      'POST /api/screenings/42/proposals': { status: 201, body: { items: [], created: 2, alreadyProposed: 0 } },
      'GET /api/auth/csrf': { body: { token: 't' } },
    });
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'screening', query: { siteId: '1' } });
    const wrapper = mountInLayout(ScreeningPage, harness);
    await flushPromises();
    await wrapper.get('input[data-testid="screening-budget"]').setValue('2500');
    await wrapper.get('[data-testid="screening-start"]').trigger('click');
    await flushPromises();
    const start = calls.find((call) => call.method === 'POST' && call.url.pathname === '/api/sites/1/screening');
    expect(JSON.parse(String(start?.init.body))).toEqual({ rankBy: 'npv', budget: 2500 });
    expect(wrapper.get('[data-testid="screening-progress-value"]').text()).toBe('40 %');
    expect(harness.router.currentRoute.value.query.jobId).toBe('42');

    // The page polls every POLL_MS (800 ms).
    await new Promise((resolve) => setTimeout(resolve, 1200));
    await flushPromises();
    expect(wrapper.get('[data-testid="screening-progress-value"]').text()).toBe('100 %');
    const tile = (key: string) => Number(wrapper.get(`[data-testid="screening-total-${key}"]`).attributes('data-value'));
    expect(tile('capex')).toBe(result.totals.capex);
    expect(tile('npv')).toBe(result.totals.npv);
    expect(tile('cost')).toBe(result.totals.costSaved);
    expect(wrapper.findAll('[data-testid="screening-table"] td[data-selected="yes"]')).toHaveLength(2);

    await wrapper.get('[data-testid="screening-propose"]').trigger('click');
    await flushPromises();
    const propose = calls.find((call) => call.url.pathname === '/api/screenings/42/proposals');
    expect(JSON.parse(String(propose?.init.body))).toEqual({ motorIds: [1, 2] });
  }, 20_000);

  it('adds money of a selection in decimal and rounds once, like the server', () => {
    const totals = totalsOf([row(1, true, { costSaved: 0.1, capex: 0.2, npv: 0.7 }), row(2, true, { costSaved: 0.2, capex: 0.1, npv: 0.1 })]);
    expect(totals.costSaved).toBe(0.3);
    expect(totals.capex).toBe(0.3);
    expect(totals.npv).toBe(0.8);
    expect(totals.motors).toBe(2);
  });

  it('follows a job from the URL after a reload and offers no start to a viewer', async () => {
    fakeFetch({
      'GET /api/sites': { body: { items: [site], total: 1, page: 1, pageSize: 100 } },
      'GET /api/jobs/42': { body: job('done', 1) },
    });
    const harness = createHarness('viewer');
    await harness.router.push({ name: 'screening', query: { jobId: '42' } });
    const wrapper = mountInLayout(ScreeningPage, harness);
    await flushPromises();
    expect(wrapper.get('[data-testid="screening-progress-value"]').text()).toBe('100 %');
    expect(wrapper.find('[data-testid="screening-totals"]').exists()).toBe(true);
    expect(wrapper.find('[data-testid="screening-start"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="screening-propose"]').exists()).toBe(false);
  }, 20_000);
});
