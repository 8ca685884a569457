import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));
vi.setConfig({ testTimeout: 30_000 });

import RetrofitLogPage from 'pages/RetrofitLogPage.vue';
import OverviewRealisedSavings from 'components/OverviewRealisedSavings.vue';
import { createHarness, fakeFetch, flushPromises, mountInLayout, mountWithApp } from './mount';
import { emptySummary, logItem, sitesList, summary } from './retrofit-log-fixtures';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const testid = (id: string) => `[data-testid="${id}"]`;
const items = [
  logItem(),
  logItem({ id: 13, motorTag: 'W-F-201', optionCode: 'bldc-vsd', status: 'proposed', overdue: true, overdueReason: 'waiting 41 days for a decision (more than 30)' }),
  logItem({ id: 14, motorTag: 'W-P-105', status: 'verified', verifiedSavingsKwh: 9200, installationDate: '2026-11-12', statusChangedAt: '2026-12-01T10:00:00.000Z' }),
  logItem({ id: 15, motorTag: 'W-C-301', status: 'rejected' }),
];

function routes(list = items) {
  return fakeFetch({
    'GET /api/retrofits': { body: { items: list, total: list.length, page: 1, pageSize: 500 } },
    'GET /api/retrofits/verification-summary': { body: summary },
    'GET /api/sites': { body: sitesList },
  });
}

describe('RetrofitLogPage', () => {
  it('lists every retrofit with its status, option, stage and savings in units, and flags the overdue one', async () => {
    routes();
    const harness = createHarness('viewer');
    await harness.router.push({ name: 'retrofits' });
    const wrapper = mountInLayout(RetrofitLogPage, harness);
    await flushPromises();
    const rows = wrapper.findAll(`${testid('retrofits-table')} tbody tr`);
    expect(rows).toHaveLength(4);
    const text = wrapper.get(testid('retrofits-table')).text();
    expect(text).toContain('New IE4 motor');
    expect(text).toContain('BLDC motor with drive, + speed control');
    expect(text).toContain('Installation due 10 Nov 2026');
    expect(text).toContain('10,000 kWh/yr');
    expect(text).toContain('9,200 kWh/yr');
    // 9 200 / 10 000 = 92 %.
    expect(text).toContain('92 %');
    expect(text).toContain('Overdue: waiting 41 days for a decision');
    expect(wrapper.findAll(testid('retrofit-overdue'))).toHaveLength(1);
    expect(wrapper.get(testid('retrofits-count')).text()).toBe('4 retrofits, 1 overdue');
    expect(wrapper.get(testid('retrofits-summary-verified')).text()).toBe('9,200 kWh/yr');
    expect(wrapper.get(testid('retrofits-summary-realised')).text()).toBe('92 %');
  });

  it('sends the filters of the address, keeps them in it, and asks the summary for the chosen site', async () => {
    const { calls } = routes();
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'retrofits', query: { status: 'ordered', overdue: 'true', siteId: 'x' } });
    const wrapper = mountInLayout(RetrofitLogPage, harness);
    await flushPromises();
    const list = () => calls.filter((call) => call.url.pathname === '/api/retrofits');
    expect(Object.fromEntries(list()[0]!.url.searchParams)).toEqual({ status: 'ordered', overdue: 'true', pageSize: '500' });

    wrapper.findAllComponents({ name: 'QSelect' })[1]!.vm.$emit('update:modelValue', 3);
    await flushPromises();
    expect(Object.fromEntries(list().at(-1)!.url.searchParams)).toEqual({ status: 'ordered', overdue: 'true', siteId: '3', pageSize: '500' });
    const summaries = calls.filter((call) => call.url.pathname === '/api/retrofits/verification-summary');
    expect(summaries.at(-1)!.url.searchParams.get('siteId')).toBe('3');
    expect(harness.router.currentRoute.value.query).toEqual({ status: 'ordered', siteId: '3', overdue: 'true' });
  });

  it('shows a board with one column per status in the order of the lifecycle, rejected last', async () => {
    routes();
    const harness = createHarness('viewer');
    await harness.router.push({ name: 'retrofits', query: { view: 'board' } });
    const wrapper = mountInLayout(RetrofitLogPage, harness);
    await flushPromises();
    const columns = wrapper.findAll('[data-testid^="retrofits-board-"]:not([data-testid^="retrofits-board-card"])');
    expect(columns.map((column) => column.attributes('data-testid'))).toEqual([
      'retrofits-board-proposed',
      'retrofits-board-approved',
      'retrofits-board-ordered',
      'retrofits-board-installed',
      'retrofits-board-verified',
      'retrofits-board-rejected',
    ]);
    expect(wrapper.get(testid('retrofits-board-verified')).text()).toContain('Verified 9,200 kWh/yr');
    expect(wrapper.get(testid('retrofits-board-proposed')).text()).toContain('overdue');
    await wrapper.get(testid('retrofits-board-card-12')).trigger('click');
    await vi.waitFor(() => expect(harness.router.currentRoute.value.name).toBe('retrofit-detail'), { timeout: 15_000 });
    expect(harness.router.currentRoute.value.params).toEqual({ id: '12' });
  });

  it('explains where retrofits come from when the log is empty, and offers a retry when it fails', async () => {
    routes([]);
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'retrofits' });
    const empty = mountInLayout(RetrofitLogPage, harness);
    await flushPromises();
    expect(empty.get(testid('retrofits-empty')).text()).toContain('proposes one from a motor’s page');

    fakeFetch({ 'GET /api/retrofits': { status: 500, body: { error: { code: 'internal', message: 'Database unavailable', details: null } } } });
    const failing = mountInLayout(RetrofitLogPage, createHarness('engineer'));
    await flushPromises();
    expect(failing.get(testid('retrofits-error')).text()).toContain('Database unavailable');
  });
});

describe('OverviewRealisedSavings', () => {
  it('shows realised against predicted per site with an installed retrofit and for the organisation', async () => {
    fakeFetch({ 'GET /api/retrofits/verification-summary': { body: summary } });
    const wrapper = mountWithApp(OverviewRealisedSavings, createHarness('viewer'));
    await flushPromises();
    // Only the site with installed retrofits has a row.
    expect(wrapper.find(testid('overview-realised-site-1')).exists()).toBe(false);
    const site = wrapper.get(testid('overview-realised-site-3')).text();
    expect(site).toContain('1 of 2');
    expect(site).toContain('10.0');
    expect(site).toContain('9.2');
    expect(site).toContain('92 %');
    expect(wrapper.get(testid('overview-realised-verified')).text()).toBe('9.2 ± 0.4');
    expect(wrapper.get(testid('overview-realised-pct')).text()).toBe('92 %');
    // Chart series in MWh/yr: predicted 10, verified 9.2.
    expect(wrapper.get(testid('overview-realised-chart')).text()).toBe('[{"name":"Predicted","data":[10]},{"name":"Verified","data":[9.2]}]');
  });

  it('says when nothing is installed yet', async () => {
    fakeFetch({ 'GET /api/retrofits/verification-summary': { body: emptySummary } });
    const wrapper = mountWithApp(OverviewRealisedSavings, createHarness('viewer'));
    await flushPromises();
    expect(wrapper.get(testid('overview-realised-empty')).text()).toContain('No retrofit installed yet');
  });
});
