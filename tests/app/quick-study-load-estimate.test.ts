import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import QuickStudyLoadEstimate from 'components/QuickStudyLoadEstimate.vue';
import { INDUCTION_CONSTANT_LOSS_SHARE, lossSplit } from 'calc/efficiency/part-load';
import { loadFromCurrent, loadFromInputPower, loadFromSlip } from 'calc/loads/estimation';
import { createHarness, flushPromises, mountWithApp } from './mount';

afterEach(() => {
  document.body.innerHTML = '';
});

const props = { ratedPowerKw: 11, efficiencyPct: 89.8, poles: 4, frequencyHz: 50, speedRpm: 1460, ratedCurrentA: 21, voltageV: 400 };

function mountPanel() {
  return mountWithApp(QuickStudyLoadEstimate, createHarness('engineer'), { props });
}

async function type(wrapper: ReturnType<typeof mountPanel>, testid: string, value: string) {
  await wrapper.get(`input[data-testid="${testid}"]`).setValue(value);
  await flushPromises();
}

async function choose(wrapper: ReturnType<typeof mountPanel>, label: string) {
  const button = wrapper.findAll('[data-testid="load-estimate-method"] button').find((candidate) => candidate.text() === label);
  await button!.trigger('click');
  await flushPromises();
}

describe('QuickStudyLoadEstimate', { timeout: 20_000 }, () => {
  it('estimates the load from measured input power with calc’s loss model, shows ±5 % and applies it', async () => {
    const wrapper = mountPanel();
    await type(wrapper, 'load-estimate-inputKw', '8.2');
    const expected = loadFromInputPower(8.2, lossSplit(11, 0.898, INDUCTION_CONSTANT_LOSS_SHARE));
    const value = wrapper.get('[data-testid="load-estimate-value"]');
    expect(Number(value.attributes('data-value'))).toBe(expected.loadFraction);
    expect(value.text()).toContain(`${(expected.loadFraction * 100).toFixed(1)} %`);
    expect(value.text()).toContain('± 5 %');
    await wrapper.get('[data-testid="load-estimate-apply"]').trigger('click');
    expect(wrapper.emitted('apply')).toEqual([[expected.loadFraction]]);
  });

  it('uses the slip method with the voltage correction and its ±20 % uncertainty', async () => {
    const wrapper = mountPanel();
    await choose(wrapper, 'Speed (slip)');
    expect((wrapper.get('input[data-testid="load-estimate-ratedSpeedRpm"]').element as HTMLInputElement).value).toBe('1460');
    await type(wrapper, 'load-estimate-speedRpm', '1475');
    await type(wrapper, 'load-estimate-voltageV', '390');
    const expected = loadFromSlip(1475, 1460, 4, 50, 390, 400);
    expect(Number(wrapper.get('[data-testid="load-estimate-value"]').attributes('data-value'))).toBe(expected.loadFraction);
    expect(wrapper.get('[data-testid="load-estimate-value"]').text()).toContain('± 20 %');
  });

  it('uses the current method, worse below half load', async () => {
    const wrapper = mountPanel();
    await choose(wrapper, 'Current');
    await type(wrapper, 'load-estimate-currentA', '9');
    const expected = loadFromCurrent(9, 21);
    expect(Number(wrapper.get('[data-testid="load-estimate-value"]').attributes('data-value'))).toBe(expected.loadFraction);
    expect(wrapper.get('[data-testid="load-estimate-value"]').text()).toContain('± 30 %');
  });

  it('names calc’s rule when a reading is impossible', async () => {
    const wrapper = mountPanel();
    await choose(wrapper, 'Speed (slip)');
    await type(wrapper, 'load-estimate-speedRpm', '1600');
    expect(wrapper.get('[data-testid="load-estimate-error"]').text()).toBe('Measured speed must be between 1050 and 1500');
    expect(wrapper.find('[data-testid="load-estimate-apply"]').exists()).toBe(false);
  });
});
