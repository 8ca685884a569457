import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));
// Mounting a whole page takes seconds on a busy machine.
vi.setConfig({ testTimeout: 30_000 });

import MotorFormPage from 'pages/MotorFormPage.vue';
import { resetPowerUnitForTests } from 'composables/usePowerUnit';
import { createHarness, fakeFetch, flushPromises, mountInLayout } from './mount';
import { motor, sitesList } from './motor-fixtures';

beforeEach(() => {
  localStorage.clear();
  resetPowerUnitForTests();
});
afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const bodyOf = (call: { init: RequestInit } | undefined) => JSON.parse(String(call?.init.body)) as Record<string, unknown>;

describe('MotorFormPage', () => {
  it('checks the fields with the shared schema and sends nothing while any is wrong', async () => {
    const { calls } = fakeFetch({ 'GET /api/sites': { body: sitesList } });
    const harness = createHarness('engineer');
    vi.spyOn(harness.router, 'push').mockResolvedValue(undefined);
    const wrapper = mountInLayout(MotorFormPage, harness, {}, { id: null, siteId: 1 });
    await flushPromises();
    // The site's supply is the starting point of a new motor.
    expect((wrapper.get('input[data-testid="motor-form-voltageV"]').element as HTMLInputElement).value).toBe('400');
    await wrapper.get('input[data-testid="motor-form-powerFactor"]').setValue('1.4');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    expect(wrapper.text()).toContain('Tag is required');
    expect(wrapper.text()).toContain('Rated power is required');
    expect(wrapper.text()).toContain('Power factor must be at most 1');
    expect(calls.filter((call) => call.method === 'POST')).toHaveLength(0);
  });

  it('takes the rated power in hp and sends kW', async () => {
    localStorage.setItem('statorline.powerUnit.7', 'hp');
    const { calls } = fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/auth/csrf': { body: { token: 't' } },
      'POST /api/motors': { status: 201, body: motor({ id: 40, tag: 'F-9' }) },
    });
    const harness = createHarness('engineer');
    const push = vi.spyOn(harness.router, 'push').mockResolvedValue(undefined);
    const wrapper = mountInLayout(MotorFormPage, harness, {}, { id: null, siteId: 1 });
    await flushPromises();
    await wrapper.get('input[data-testid="motor-form-tag"]').setValue('F-9');
    await wrapper.get('input[data-testid="motor-form-ratedPowerKw"]').setValue('10');
    await flushPromises();
    expect(wrapper.text()).toContain('= 7.5 kW');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    const post = calls.find((call) => call.method === 'POST' && call.url.pathname === '/api/motors');
    // 10 hp × 0.7457 kW/hp (745.7 W per mechanical horsepower).
    expect(bodyOf(post)).toMatchObject({ siteId: 1, tag: 'F-9', ratedPowerKw: 7.457, poles: 4, voltageV: 400, frequencyHz: 50, dutyProfile: null });
    expect(push).toHaveBeenCalledWith({ name: 'motor-detail', params: { id: 40 } });
  });

  it('sends the loaded version and offers a reload when someone saved first', async () => {
    const { calls } = fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/motors/11': { body: motor() },
      'GET /api/auth/csrf': { body: { token: 't' } },
      'PATCH /api/motors/11': {
        status: 409,
        body: { error: { code: 'stale-version', message: 'This motor was changed by someone else since you opened it.' } },
      },
    });
    const wrapper = mountInLayout(MotorFormPage, createHarness('engineer'), {}, { id: 11 });
    await flushPromises();
    expect((wrapper.get('input[data-testid="motor-form-tag"]').element as HTMLInputElement).value).toBe('D-P-101');
    await wrapper.get('input[data-testid="motor-form-description"]').setValue('Raw milk pump, rewound');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    expect(bodyOf(calls.find((call) => call.method === 'PATCH'))).toMatchObject({ version: 4, description: 'Raw milk pump, rewound', ratedPowerKw: 7.457 });
    expect(wrapper.get('[data-testid="motor-form-stale"]').text()).toContain('Someone else saved this motor');

    await wrapper.get('[data-testid="motor-form-reload"]').trigger('click');
    await flushPromises();
    expect(calls.filter((call) => call.method === 'GET' && call.url.pathname === '/api/motors/11')).toHaveLength(2);
    expect(wrapper.find('[data-testid="motor-form-stale"]').exists()).toBe(false);
    expect((wrapper.get('input[data-testid="motor-form-description"]').element as HTMLInputElement).value).toBe('Raw milk pump');
  });

  it('shows the server’s refusal under the field it names', async () => {
    fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/motors/11': { body: motor() },
      'GET /api/auth/csrf': { body: { token: 't' } },
      'PATCH /api/motors/11': {
        status: 409,
        body: { error: { code: 'duplicate-tag', message: 'tag: D-P-102 is already used by another motor at this site', details: [{ field: 'tag', message: 'is already used at this site' }] } },
      },
    });
    const wrapper = mountInLayout(MotorFormPage, createHarness('engineer'), {}, { id: 11 });
    await flushPromises();
    await wrapper.get('input[data-testid="motor-form-tag"]').setValue('D-P-102');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    expect(wrapper.text()).toContain('Tag is already used at this site');
    expect(wrapper.find('[data-testid="motor-form-stale"]').exists()).toBe(false);
  });

  it('switches to a duty profile that starts from the running hours and labels flow for a pump', async () => {
    fakeFetch({ 'GET /api/sites': { body: sitesList }, 'GET /api/motors/11': { body: motor() } });
    const wrapper = mountInLayout(MotorFormPage, createHarness('engineer'), {}, { id: 11 });
    await flushPromises();
    expect(wrapper.find('[data-testid="duty-profile-editor"]').exists()).toBe(false);
    const profileOption = wrapper.get('[data-testid="motor-form-usage"]').findAll('.q-radio').at(1);
    await profileOption?.trigger('click');
    await flushPromises();
    const editor = wrapper.get('[data-testid="duty-profile-editor"]');
    expect(editor.text()).toContain('Flow (% of rated flow)');
    expect(wrapper.get('[data-testid="duty-profile-total"]').text()).toContain('6,000 h of 8,760 h');
  });
});
