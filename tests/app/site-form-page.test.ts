import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import SiteFormPage from 'pages/SiteFormPage.vue';
import type { SiteOutput } from 'shared/site';
import { createHarness, fakeFetch, flushPromises, mountInLayout } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const coldStore: SiteOutput = {
  id: 2,
  name: 'Cold store',
  code: null,
  location: null,
  voltageV: 460,
  frequencyHz: 60,
  energyPricePerKwh: 0.12,
  timeOfUse: [],
  demandChargePerKwMonth: 11,
  currency: 'USD',
  co2KgPerKwh: 0.4,
  defaultHoursPerYear: 8760,
  archived: false,
  motorCount: 40,
  installedKw: 600,
  version: 5,
  updatedAt: '2026-01-10T08:00:00.000Z',
};

describe('SiteFormPage', () => {
  it('sends the loaded version with an edit and offers a reload when someone saved first', async () => {
    const { calls } = fakeFetch({
      'GET /api/sites/2': { body: coldStore },
      'PATCH /api/sites/2': {
        status: 409,
        body: { error: { code: 'stale-version', message: 'This site was changed by someone else since you opened it.' } },
      },
    });
    const harness = createHarness('engineer');
    const wrapper = mountInLayout(SiteFormPage, harness, {}, { id: 2 });
    await flushPromises();
    expect((wrapper.get('[data-testid="site-form-name"]').element as HTMLInputElement).value).toBe('Cold store');
    await wrapper.get('[data-testid="site-form-name"]').setValue('Cold store North');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    const patch = calls.find((call) => call.method === 'PATCH');
    expect(JSON.parse(String(patch?.init.body))).toMatchObject({ name: 'Cold store North', version: 5, voltageV: 460 });
    expect(wrapper.get('[data-testid="site-form-stale"]').text()).toContain('Someone else saved this site');

    await wrapper.get('[data-testid="site-form-reload"]').trigger('click');
    await flushPromises();
    expect(calls.filter((call) => call.method === 'GET' && call.url.pathname === '/api/sites/2')).toHaveLength(2);
    expect(wrapper.find('[data-testid="site-form-stale"]').exists()).toBe(false);
    expect((wrapper.get('[data-testid="site-form-name"]').element as HTMLInputElement).value).toBe('Cold store');
  });

  it('shows a message under a field the server refused', async () => {
    fakeFetch({
      'GET /api/auth/csrf': { body: { token: 't' } },
      'POST /api/sites': {
        status: 400,
        body: { error: { code: 'invalid-input', message: 'voltageV: must be at most 15 kV', details: { field: 'voltageV' } } },
      },
    });
    const wrapper = mountInLayout(SiteFormPage, createHarness('admin'));
    await flushPromises();
    await wrapper.get('[data-testid="site-form-name"]').setValue('New plant');
    await wrapper.get('[data-testid="site-form-price"]').setValue('0.2');
    await wrapper.get('[data-testid="site-form-co2"]').setValue('0.3');
    await wrapper.get('[data-testid="site-form-hours"]').setValue('4000');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    expect(wrapper.text()).toContain('Line voltage must be at most 15 kV');
  });
});
