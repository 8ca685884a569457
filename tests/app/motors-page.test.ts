import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));
// Mounting a whole page takes seconds on a busy machine.
vi.setConfig({ testTimeout: 30_000 });

import MotorsPage from 'pages/MotorsPage.vue';
import { resetPowerUnitForTests } from 'composables/usePowerUnit';
import { createHarness, fakeFetch, flushPromises, mountInLayout } from './mount';
import { emptyList, motor, sitesList } from './motor-fixtures';

beforeEach(() => {
  localStorage.clear();
  resetPowerUnitForTests();
});
afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const motorCalls = (calls: { method: string; url: URL }[]) => calls.filter((call) => call.url.pathname === '/api/motors');

describe('MotorsPage', () => {
  it('asks the server for one sorted page with the filters of the address', async () => {
    const { calls } = fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/motors': { body: { items: [motor()], total: 100_000, page: 1, pageSize: 25 } },
    });
    const harness = createHarness('viewer');
    await harness.router.push({ name: 'motors', query: { application: 'fan,pump,bogus', minKw: '10', q: 'P-1' } });
    const wrapper = mountInLayout(MotorsPage, harness);
    await flushPromises();
    const request = motorCalls(calls)[0]?.url.searchParams;
    expect(Object.fromEntries(request ?? [])).toEqual({ page: '1', pageSize: '25', sort: 'tag', q: 'P-1', application: 'fan,pump', minKw: '10' });
    expect(motorCalls(calls)).toHaveLength(1);
    const table = wrapper.get('[data-testid="motors-table"]');
    expect(table.text()).toContain('D-P-101');
    expect(table.text()).toContain('1–25 of 100,000');
    expect(wrapper.get('[data-testid="motors-count"]').text()).toContain('100,000 motors match the filters');
  });

  it('shows power in kW or hp as the user chose, remembers it, and filters in the chosen unit', async () => {
    const { calls } = fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/motors': { body: { items: [motor({ ratedPowerKw: 7.457 })], total: 1, page: 1, pageSize: 25 } },
    });
    const wrapper = mountInLayout(MotorsPage, createHarness('engineer'));
    await flushPromises();
    const powerCell = () => wrapper.get('[data-testid="motors-table"] tbody tr').findAll('td').find((cell) => /kW|hp/.test(cell.text()));
    expect(powerCell()?.text()).toBe('7.5 kW');

    const hp = wrapper.get('[data-testid="motors-unit-toggle"]').findAll('button').find((button) => button.text() === 'hp');
    await hp?.trigger('click');
    await flushPromises();
    // 7.457 kW / 0.7457 kW/hp = 10 hp (definition of the mechanical horsepower, 745.7 W).
    expect(powerCell()?.text()).toBe('10 hp');
    expect(localStorage.getItem('statorline.powerUnit.7')).toBe('hp');

    await wrapper.get('input[data-testid="motors-filter-minPower"]').setValue('20');
    await vi.waitFor(() => expect(motorCalls(calls).at(-1)?.url.searchParams.get('minKw')).toBe('14.914'), { timeout: 2000 });
    expect(motorCalls(calls).at(-1)?.url.searchParams.get('page')).toBe('1');
  });

  it('starts in the unit the user chose on an earlier visit', async () => {
    localStorage.setItem('statorline.powerUnit.7', 'hp');
    fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/motors': { body: { items: [motor({ ratedPowerKw: 110 })], total: 1, page: 1, pageSize: 25 } },
    });
    const wrapper = mountInLayout(MotorsPage, createHarness('viewer'));
    await flushPromises();
    // 110 / 0.7457 = 147.5 hp, shown whole above 100.
    expect(wrapper.get('[data-testid="motors-table"]').text()).toContain('148 hp');
  });

  it('offers “New motor” to an engineer, not to a viewer, and points an empty register to Intake', async () => {
    fakeFetch({ 'GET /api/sites': { body: sitesList }, 'GET /api/motors': { body: emptyList } });
    const viewer = mountInLayout(MotorsPage, createHarness('viewer'));
    await flushPromises();
    expect(viewer.find('[data-testid="motors-new"]').exists()).toBe(false);
    expect(viewer.get('[data-testid="motors-empty"]').text()).toContain('An engineer brings the motor list in through Intake');
    document.body.innerHTML = '';

    const engineer = mountInLayout(MotorsPage, createHarness('engineer'));
    await flushPromises();
    expect(engineer.find('[data-testid="motors-new"]').exists()).toBe(true);
    expect(engineer.get('[data-testid="motors-empty"]').text()).toContain('The register is empty.');
    expect(engineer.get('[data-testid="motors-empty-intake"]').attributes('href')).toBe('/intake');
  });

  it('counts the selection and clears it', async () => {
    fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/motors': { body: { items: [motor(), motor({ id: 12, tag: 'D-P-102' })], total: 2, page: 1, pageSize: 25 } },
    });
    const harness = createHarness('engineer');
    const push = vi.spyOn(harness.router, 'push');
    const wrapper = mountInLayout(MotorsPage, harness);
    await flushPromises();
    const boxes = wrapper.findAll('[data-testid="motors-table"] tbody .q-checkbox');
    expect(boxes).toHaveLength(2);
    await boxes[0]?.trigger('click');
    await boxes[1]?.trigger('click');
    await flushPromises();
    expect(wrapper.get('[data-testid="motors-selection"]').text()).toContain('2 selected');
    expect(wrapper.find('[data-testid="motors-export-selected"]').exists()).toBe(true);
    // A click on a box selects; it does not open the motor.
    expect(push).not.toHaveBeenCalled();
    await wrapper.get('[data-testid="motors-clear-selection"]').trigger('click');
    await flushPromises();
    expect(wrapper.find('[data-testid="motors-selection"]').exists()).toBe(false);
  });

  it('opens a motor on a row click', async () => {
    fakeFetch({ 'GET /api/sites': { body: sitesList }, 'GET /api/motors': { body: { items: [motor()], total: 1, page: 1, pageSize: 25 } } });
    const harness = createHarness('viewer');
    await harness.router.push({ name: 'motors' });
    // The detail page itself is not loaded here (a lazy route); the navigation asked for is enough.
    const push = vi.spyOn(harness.router, 'push').mockResolvedValue(undefined);
    const wrapper = mountInLayout(MotorsPage, harness);
    await flushPromises();
    await wrapper.get('[data-testid="motors-table"] tbody tr td:nth-child(3)').trigger('click');
    expect(push).toHaveBeenCalledWith({ name: 'motor-detail', params: { id: 11 } });
  });
});
