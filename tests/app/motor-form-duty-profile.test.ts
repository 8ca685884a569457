import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));
// Mounting a whole page takes seconds on a busy machine.
vi.setConfig({ testTimeout: 30_000 });

import { defineComponent, h, ref } from 'vue';
import MotorFormDutyProfile from 'components/MotorFormDutyProfile.vue';
import { draftToInput, dutyBin, dutyMeanFraction, dutyTotalHours, emptyMotorDraft, type DutyBinDraft } from 'components/motor-form';
import { createHarness, flushPromises, mountWithApp } from './mount';

afterEach(() => {
  document.body.innerHTML = '';
});

/** The editor bound to a list the test can read, as the form binds it. */
function mountEditor(initial: DutyBinDraft[], flow = false) {
  const bins = ref(initial);
  const Host = defineComponent({
    setup: () => () => h(MotorFormDutyProfile, { bins: bins.value, flow, 'onUpdate:bins': (next: DutyBinDraft[]) => (bins.value = next) }),
  });
  return { wrapper: mountWithApp(Host, createHarness('engineer')), bins };
}

describe('MotorFormDutyProfile', () => {
  it('adds up the hours against the 8760 h of a year', async () => {
    const { wrapper } = mountEditor([dutyBin(50, 2000), dutyBin(80, 3000)]);
    await flushPromises();
    const total = wrapper.get('[data-testid="duty-profile-total"]');
    expect(total.text()).toContain('5,000 h of 8,760 h');
    // Mean load: (0.5·2000 + 0.8·3000) / 5000 = 0.68 (arithmetic, no source needed).
    expect(total.text()).toContain('mean 68 %');
    expect(total.classes()).not.toContain('text-negative');
    expect(wrapper.find('[data-testid="duty-profile-over"]').exists()).toBe(false);
  });

  it('flags a profile of more hours than a year has', async () => {
    const { wrapper } = mountEditor([dutyBin(50, 5000), dutyBin(100, 3000)]);
    await flushPromises();
    await wrapper.get('input[data-testid="duty-bin-1-hours"]').setValue('4000');
    await flushPromises();
    expect(wrapper.get('[data-testid="duty-profile-total"]').text()).toContain('9,000 h of 8,760 h');
    expect(wrapper.get('[data-testid="duty-profile-total"]').classes()).toContain('text-negative');
    expect(wrapper.get('[data-testid="duty-profile-over"]').text()).toContain('240 h more than a year has');
  });

  it('adds and removes bins, and charts hours per bin in order of load', async () => {
    const { wrapper, bins } = mountEditor([dutyBin(75, 1000)]);
    await flushPromises();
    expect(wrapper.get('[data-testid="duty-bin-0-remove"]').attributes('disabled')).toBeDefined();
    await wrapper.get('[data-testid="duty-profile-add"]').trigger('click');
    await flushPromises();
    expect(bins.value.map((bin) => bin.percent)).toEqual([75, 100]);
    await wrapper.get('input[data-testid="duty-bin-1-percent"]').setValue('40');
    await wrapper.get('input[data-testid="duty-bin-1-hours"]').setValue('500');
    await flushPromises();
    // The chart stub prints its series: hours sorted by load (40 % first).
    expect(wrapper.get('[data-testid="chart-stub"]').text()).toBe(JSON.stringify([{ name: 'Hours', data: [500, 1000] }]));
    await wrapper.get('[data-testid="duty-bin-0-remove"]').trigger('click');
    await flushPromises();
    expect(bins.value.map((bin) => [bin.percent, bin.hours])).toEqual([[40, 500]]);
  });

  it('reads load for most machines and flow for fans and pumps', async () => {
    expect(mountEditor([dutyBin(50, 100)]).wrapper.text()).toContain('Load (% of rated load)');
    expect(mountEditor([dutyBin(50, 100)], true).wrapper.text()).toContain('Flow (% of rated flow)');
  });
});

describe('the motor draft', () => {
  it('sends a duty profile as fractions and its total as the running hours', () => {
    const draft = { ...emptyMotorDraft(), usage: 'duty-profile' as const, loadFactor: 0.7, dutyProfile: [dutyBin(62.5, 3000), dutyBin(100, 1000)] };
    const input = draftToInput(draft);
    expect(input.dutyProfile).toEqual([
      { fraction: 0.625, hours: 3000 },
      { fraction: 1, hours: 1000 },
    ]);
    expect(input.hoursPerYear).toBe(4000);
    expect(input.loadFactor).toBeNull();
    expect(dutyTotalHours(draft.dutyProfile)).toBe(4000);
    expect(dutyMeanFraction(draft.dutyProfile)).toBeCloseTo((0.625 * 3000 + 1000) / 4000, 12);
  });

  it('sends one load factor without a profile', () => {
    const input = draftToInput({ ...emptyMotorDraft(), hoursPerYear: 5000, loadFactor: 0.75, dutyProfile: [dutyBin(50, 10)] });
    expect(input).toMatchObject({ hoursPerYear: 5000, loadFactor: 0.75, dutyProfile: null });
  });
});
