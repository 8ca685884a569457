import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));
vi.setConfig({ testTimeout: 30_000 });

import MotorDetailRetrofits from 'components/MotorDetailRetrofits.vue';
import { createHarness, fakeFetch, flushPromises, mountWithApp } from './mount';
import { detail, logItem } from './retrofit-log-fixtures';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const testid = (id: string) => `[data-testid="${id}"]`;
const inBody = (selector: string) => document.body.querySelector<HTMLElement>(selector);

const option = (code: string, label: string, savingsKwh: number, savingsCost: number, capex: number, npv: number) => ({
  code,
  label,
  savingsKwh,
  savingsCost,
  capex,
  npv,
  simplePaybackYears: savingsCost > 0 ? capex / savingsCost : null,
});
const preview = {
  input: {},
  bldcDesignId: null,
  sources: [],
  result: {
    currency: 'EUR',
    options: [
      option('keep', 'Keep as is', 0, 0, 0, 0),
      option('ie4', 'New IE4 motor', 4244, 677, 3730, 2100),
      option('ie4-vsd', 'New IE4 motor, + speed control', 93_437, 13_262, 7905, 98_000),
    ],
    recommended: { code: 'ie4-vsd', reason: 'highest NPV' },
  },
};

describe('MotorDetailRetrofits', () => {
  it('proposes a retrofit from the motor’s assessment with the chosen option’s figures, then opens it', async () => {
    const { calls } = fakeFetch({
      'GET /api/retrofits': { body: { items: [], total: 0, page: 1, pageSize: 100 } },
      'POST /api/studies/from-motor/5': { body: preview },
      'POST /api/retrofits': { status: 201, body: detail({ id: 31, status: 'proposed', optionCode: 'ie4' }) },
      'GET /api/auth/csrf': { body: { token: 't' } },
    });
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'motor-detail', params: { id: 5 } });
    const wrapper = mountWithApp(MotorDetailRetrofits, harness, { props: { motorId: 5, motorTag: 'W-P-101', retired: false, canEdit: true } });
    await flushPromises();
    expect(calls[0]!.url.searchParams.get('motorId')).toBe('5');
    expect(wrapper.text()).toContain('No retrofit of this motor yet');
    await wrapper.get(testid('motor-propose')).trigger('click');
    await flushPromises();

    const table = inBody(testid('motor-propose-options'))!;
    // "Keep as is" is no retrofit; the recommended option is chosen first.
    expect(table.querySelectorAll('tbody tr')).toHaveLength(2);
    expect(inBody(testid('motor-propose-option-ie4-vsd'))!.className).toContain('motor-propose__chosen');
    expect(inBody(testid('motor-propose-option-ie4-vsd'))!.textContent).toContain('93,437 kWh/yr');
    // A drive is in this option: its caution is shown with the proposal.
    expect(inBody(testid('retrofit-cautions'))!.textContent).toContain('harmonics and EMC');

    inBody(testid('motor-propose-option-ie4'))!.click();
    await flushPromises();
    expect(inBody(testid('retrofit-cautions'))!.textContent).not.toContain('EMC');
    inBody(testid('motor-propose-submit'))!.click();
    await flushPromises();
    const post = calls.find((call) => call.method === 'POST' && call.url.pathname === '/api/retrofits')!;
    expect(JSON.parse(String(post.init.body))).toEqual({ motorId: 5, optionCode: 'ie4', predictedSavingsKwh: 4244, predictedSavingsCost: 677, capex: 3730 });
    await vi.waitFor(() => expect(harness.router.currentRoute.value.name).toBe('retrofit-detail'), { timeout: 15_000 });
    expect(harness.router.currentRoute.value.params).toEqual({ id: '31' });
  });

  it('lists the motor’s retrofits and offers no second proposal while one is open', async () => {
    fakeFetch({ 'GET /api/retrofits': { body: { items: [logItem({ status: 'approved' }), logItem({ id: 9, status: 'rejected', optionCode: 'bldc' })], total: 2, page: 1, pageSize: 100 } } });
    const wrapper = mountWithApp(MotorDetailRetrofits, createHarness('engineer'), { props: { motorId: 5, motorTag: 'W-P-101', retired: false, canEdit: true } });
    await flushPromises();
    expect(wrapper.get(testid('motor-retrofit-12')).text()).toContain('New IE4 motor');
    expect(wrapper.get(testid('motor-retrofit-12')).text()).toContain('Approved');
    expect(wrapper.get(testid('motor-retrofit-9')).text()).toContain('Rejected');
    expect(wrapper.find(testid('motor-propose')).exists()).toBe(false);
    expect(wrapper.text()).toContain('this motor’s approved retrofit is still open');
  });

  it('offers no proposal to a viewer', async () => {
    fakeFetch({ 'GET /api/retrofits': { body: { items: [], total: 0, page: 1, pageSize: 100 } } });
    const wrapper = mountWithApp(MotorDetailRetrofits, createHarness('viewer'), { props: { motorId: 5, motorTag: 'W-P-101', retired: false, canEdit: false } });
    await flushPromises();
    expect(wrapper.find(testid('motor-propose')).exists()).toBe(false);
    expect(wrapper.text()).toContain('No retrofit of this motor yet.');
  });
});
