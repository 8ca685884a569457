import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import SitesPage from 'pages/SitesPage.vue';
import type { SiteOutput } from 'shared/site';
import { createHarness, fakeFetch, flushPromises, mountInLayout } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const dairy: SiteOutput = {
  id: 1,
  name: 'Dairy plant',
  code: 'DP',
  location: 'Kestrel Valley',
  voltageV: 400,
  frequencyHz: 50,
  energyPricePerKwh: 0.18,
  timeOfUse: [],
  demandChargePerKwMonth: 9,
  currency: 'EUR',
  co2KgPerKwh: 0.3,
  defaultHoursPerYear: 6000,
  archived: false,
  motorCount: 70,
  installedKw: 1200,
  version: 3,
  updatedAt: '2026-01-10T08:00:00.000Z',
};

describe('SitesPage', () => {
  it('asks the server for one sorted page and shows the rows', async () => {
    const { calls } = fakeFetch({ 'GET /api/sites': { body: { items: [dairy], total: 31, page: 1, pageSize: 25 } } });
    const wrapper = mountInLayout(SitesPage, createHarness('viewer'));
    await flushPromises();
    expect(calls[0]?.url.search).toBe('?page=1&pageSize=25&sort=name&archived=exclude');
    const table = wrapper.get('[data-testid="sites-table"]');
    expect(table.text()).toContain('Dairy plant');
    expect(table.text()).toContain('400 V · 50 Hz');
    expect(table.text()).toContain('1–25 of 31');
  });

  it('offers “New site” to an engineer but not to a viewer', async () => {
    fakeFetch({ 'GET /api/sites': { body: { items: [], total: 0, page: 1, pageSize: 25 } } });
    const viewer = mountInLayout(SitesPage, createHarness('viewer'));
    await flushPromises();
    expect(viewer.find('[data-testid="sites-new"]').exists()).toBe(false);
    expect(viewer.text()).toContain('No sites yet.');
    const engineer = mountInLayout(SitesPage, createHarness('engineer'));
    await flushPromises();
    expect(engineer.find('[data-testid="sites-new"]').exists()).toBe(true);
  });

  it('filters on the server and goes back to the first page', async () => {
    const { calls } = fakeFetch({ 'GET /api/sites': { body: { items: [dairy], total: 1, page: 1, pageSize: 25 } } });
    const wrapper = mountInLayout(SitesPage, createHarness('viewer'));
    await flushPromises();
    await wrapper.get('[data-testid="sites-search"]').setValue('dairy');
    await vi.waitFor(() => expect(calls.at(-1)?.url.searchParams.get('q')).toBe('dairy'), { timeout: 2000 });
    expect(calls.at(-1)?.url.searchParams.get('page')).toBe('1');
  });
});
