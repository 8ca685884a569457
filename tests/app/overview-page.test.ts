import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import OverviewPage from 'pages/OverviewPage.vue';
import type { OverviewResponse } from 'shared/overview';
import { createHarness, fakeFetch, flushPromises, mountInLayout } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  sessionStorage.clear();
  document.body.innerHTML = '';
});

const overview: OverviewResponse = {
  organization: { id: 1, name: 'Kestrel Valley Foods' },
  totals: { sites: 3, motors: 152, installedKw: 2468.37 },
  sites: [
    { id: 1, name: 'Dairy plant', motors: 70, installedKw: 1200.5 },
    { id: 2, name: 'Cold store', motors: 40, installedKw: 600 },
  ],
  byApplication: [
    { application: 'fan', motors: 50, installedKw: 700 },
    { application: 'pump', motors: 60, installedKw: 900.2 },
  ],
};

describe('OverviewPage', () => {
  it('shows the organisation’s totals, its sites and the chart data from the API', async () => {
    fakeFetch({ 'GET /api/overview': { body: overview } });
    const harness = createHarness('viewer');
    const wrapper = mountInLayout(OverviewPage, harness);
    await flushPromises();
    expect(wrapper.get('[data-testid="overview-total-sites"]').text()).toBe('3');
    expect(wrapper.get('[data-testid="overview-total-motors"]').text()).toBe('152');
    expect(wrapper.get('[data-testid="overview-total-kw"]').text()).toBe('2,468 kW');
    expect(wrapper.get('[data-testid="overview-sites-table"]').text()).toContain('Cold store');
    // Largest application first.
    expect(wrapper.get('[data-testid="overview-application-chart"]').text()).toContain('[900.2,700]');
  });

  it('shows the cautions until they are dismissed for the session', async () => {
    fakeFetch({ 'GET /api/overview': { body: overview } });
    const harness = createHarness('viewer');
    const wrapper = mountInLayout(OverviewPage, harness);
    await flushPromises();
    expect(wrapper.get('[data-testid="cautions-note"]').text()).toContain('not a design approval');
    await wrapper.get('[data-testid="cautions-dismiss"]').trigger('click');
    expect(wrapper.find('[data-testid="cautions-note"]').exists()).toBe(false);
    const again = mountInLayout(OverviewPage, harness);
    await flushPromises();
    expect(again.find('[data-testid="cautions-note"]').exists()).toBe(false);
  });

  it('says what went wrong when the overview cannot be loaded', async () => {
    fakeFetch({ 'GET /api/overview': { status: 503, body: { error: { code: 'unavailable', message: 'The database is not answering.' } } } });
    const wrapper = mountInLayout(OverviewPage, createHarness('viewer'));
    await flushPromises();
    expect(wrapper.get('[data-testid="overview-error"]').text()).toContain('The database is not answering.');
  });
});
