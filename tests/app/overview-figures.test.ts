import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import OverviewPage from 'pages/OverviewPage.vue';
import type { OverviewFigures, OverviewResponse } from 'shared/overview';
import { createHarness, fakeFetch, flushPromises, mountInLayout } from './mount';
import { dairySummary } from './case-fixtures';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const figures = (scale: number): OverviewFigures => ({
  currency: 'EUR',
  energyTodayKwh: 2_000_000 * scale,
  energyCostToday: 360_000 * scale,
  co2TodayKg: 600_000 * scale,
  unassessedMotors: 0,
  identified: { kwh: 200_000 * scale, cost: 36_000 * scale, motors: 20, source: 'case' },
  approved: { kwh: 120_000 * scale, cost: 21_600 * scale, retrofits: 8 },
  installed: { kwh: 50_000 * scale, cost: 9_000 * scale, retrofits: 3 },
  verified: { kwh: 20_000 * scale, cost: 3_600 * scale, retrofits: 1 },
});

const overview: OverviewResponse = {
  organization: { id: 1, name: 'Kestrel Valley Foods' },
  totals: { sites: 2, motors: 110, installedKw: 1800 },
  sites: [
    { id: 1, name: 'Dairy plant', motors: 70, installedKw: 1200, figures: figures(1), latestCaseId: 41 },
    { id: 2, name: 'Cold store', motors: 40, installedKw: 600, figures: figures(0.5), latestCaseId: null },
  ],
  byApplication: [{ application: 'fan', motors: 50, installedKw: 700 }],
  figures: figures(1.5),
  latestCases: [dairySummary],
};

describe('OverviewPage with energy and savings figures', () => {
  it('shows the organisation’s energy and each stage of the savings pipeline', async () => {
    fakeFetch({ 'GET /api/overview': { body: overview } });
    const wrapper = mountInLayout(OverviewPage, createHarness('viewer'));
    await flushPromises();
    expect(wrapper.get('[data-testid="overview-total-sites"]').text()).toBe('2');
    expect(wrapper.get('[data-testid="overview-energy-today"]').text()).toBe('3,000');
    expect(wrapper.get('[data-testid="overview-identified"]').text()).toBe('300');
    expect(wrapper.get('[data-testid="overview-approved"]').text()).toBe('180');
    expect(wrapper.get('[data-testid="overview-verified"]').text()).toBe('30');
    expect(wrapper.get('[data-testid="overview-figures"]').text()).toContain('Approved, MWh/yr');
    expect(wrapper.get('[data-testid="overview-figures"]').text()).toContain('€32,400/yr · 8 retrofits');
    const table = wrapper.get('[data-testid="overview-sites-table"]').text();
    expect(table).toContain('€36,000');
    expect(table).toContain('€1,800');
    expect(table).toContain('Approved per year');
    expect(wrapper.find('[data-testid="overview-site-case-1"]').exists()).toBe(true);
    expect(wrapper.find('[data-testid="overview-site-case-2"]').exists()).toBe(false);
  });

  it('stacks the disjoint parts of each site’s pipeline, in MWh/yr', async () => {
    fakeFetch({ 'GET /api/overview': { body: overview } });
    const wrapper = mountInLayout(OverviewPage, createHarness('viewer'));
    await flushPromises();
    const series = JSON.parse(wrapper.get('[data-testid="overview-pipeline"]').text()) as { name: string; data: number[] }[];
    expect(series.map((part) => part.name)).toEqual([
      'Verified',
      'Installed, not yet verified',
      'Approved, not yet installed',
      'Identified, not yet approved',
    ]);
    // Dairy: 20 verified, 30 installed, 70 approved, 80 identified = 200 MWh/yr identified.
    expect(series.map((part) => part.data[0])).toEqual([20, 30, 70, 80]);
    expect(series.map((part) => part.data[1])).toEqual([10, 15, 35, 40]);
  });

  it('lists the latest business cases with their status, linked to their report', async () => {
    fakeFetch({ 'GET /api/overview': { body: overview } });
    const harness = createHarness('viewer');
    const wrapper = mountInLayout(OverviewPage, harness);
    await flushPromises();
    const latest = wrapper.get('[data-testid="overview-latest-cases"]');
    expect(latest.text()).toContain('Dairy plant · v2');
    expect(latest.text()).toContain('Awaiting decision');
    expect(latest.get('[data-testid="overview-case-41"]').attributes('href')).toBe('/cases/41');
  });
});
