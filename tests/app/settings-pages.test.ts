import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import SettingsAssumptionsPage from 'pages/SettingsAssumptionsPage.vue';
import SettingsPriceBookPage from 'pages/SettingsPriceBookPage.vue';
import { DEFAULT_PRICE_BOOK } from 'calc/economics/price-book';
import type { SettingsOutput } from 'shared/settings';
import { createHarness, fakeFetch, flushPromises, mountInLayout } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const settings: SettingsOutput = {
  priceBook: {
    value: JSON.parse(JSON.stringify(DEFAULT_PRICE_BOOK)),
    stored: null,
    defaulted: ['items.rewind', 'items.ie3', 'items.ie4', 'items.ie5', 'items.bldc', 'items.vsd', 'motorInstallation', 'driveInstallation', 'rebates'],
    version: 3,
  },
  assumptions: {
    value: { discountRatePct: 8, energyEscalationPct: 2, lifeYears: { keep: 10, rewind: 10, ie3: 20, ie4: 20, ie5: 20, bldc: 15, vsd: 15 }, defaultHoursPerYear: 4000 },
    stored: { energyEscalationPct: 3 },
    defaulted: ['discountRatePct', 'defaultHoursPerYear'],
    version: 5,
  },
  materials: { magnets: [], steels: [] },
};

describe('Settings pages', { timeout: 20_000 }, () => {
  it('lets an admin save the assumptions with the version loaded; a blank field keeps calc’s default', async () => {
    const { calls } = fakeFetch({
      'GET /api/settings': { body: settings },
      'GET /api/auth/csrf': { body: { token: 't' } },
      'PUT /api/settings/assumptions': { body: settings },
    });
    const wrapper = mountInLayout(SettingsAssumptionsPage, createHarness('admin'));
    await flushPromises();
    expect((wrapper.get('input[data-testid="settings-assumption-energyEscalationPct"]').element as HTMLInputElement).value).toBe('3');
    expect(wrapper.text()).toContain('calc default 8');
    await wrapper.get('input[data-testid="settings-assumption-discountRatePct"]').setValue('6.5');
    await wrapper.get('[data-testid="settings-assumptions-save"]').trigger('click');
    await flushPromises();
    const put = calls.find((call) => call.method === 'PUT');
    expect(JSON.parse(String(put?.init.body))).toEqual({ version: 5, discountRatePct: 6.5, energyEscalationPct: 3 });
  });

  it('refuses an out-of-range assumption with the shared schema’s message, without a request', async () => {
    const { calls } = fakeFetch({ 'GET /api/settings': { body: settings } });
    const wrapper = mountInLayout(SettingsAssumptionsPage, createHarness('admin'));
    await flushPromises();
    await wrapper.get('input[data-testid="settings-assumption-discountRatePct"]').setValue('120');
    await wrapper.get('[data-testid="settings-assumptions-save"]').trigger('click');
    await flushPromises();
    expect(wrapper.text()).toContain('Discount rate must be at most 100');
    expect(calls.filter((call) => call.method === 'PUT')).toHaveLength(0);
  });

  it('shows the price book read-only to an engineer (no save)', async () => {
    fakeFetch({ 'GET /api/settings': { body: settings } });
    const wrapper = mountInLayout(SettingsPriceBookPage, createHarness('engineer'));
    await flushPromises();
    expect(wrapper.find('[data-testid="settings-price-book-save"]').exists()).toBe(false);
    expect(wrapper.text()).toContain('Only an administrator changes the price book');
    expect(wrapper.get('[data-testid="price-item-ie4"]').text()).toContain('calc default');
  });

  it('tells an admin when someone saved the price book first (409) and reloads it', async () => {
    const { calls } = fakeFetch({
      'GET /api/settings': { body: settings },
      'GET /api/auth/csrf': { body: { token: 't' } },
      'PUT /api/settings/price-book': { status: 409, body: { error: { code: 'stale-version', message: 'The price book was changed by someone else.' } } },
    });
    const wrapper = mountInLayout(SettingsPriceBookPage, createHarness('admin'));
    await flushPromises();
    await wrapper.get('input[data-testid="settings-price-book-currency"]').setValue('EUR');
    await wrapper.get('[data-testid="settings-price-book-save"]').trigger('click');
    await flushPromises();
    const put = calls.find((call) => call.method === 'PUT');
    expect(JSON.parse(String(put?.init.body))).toMatchObject({ version: 3, currency: 'EUR' });
    expect(wrapper.get('[data-testid="settings-stale"]').text()).toContain('Someone saved the price book meanwhile');
    expect(calls.filter((call) => call.method === 'GET' && call.url.pathname === '/api/settings')).toHaveLength(2);
  });
});
