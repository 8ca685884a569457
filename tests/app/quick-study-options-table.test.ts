import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import QuickStudyOptionsTable from 'components/QuickStudyOptionsTable.vue';
import { assess } from 'calc/assess/assess';
import { formatIrr, formatKwh, formatMoney, formatYears } from 'src/utils/study-format';
import { createHarness, mountWithApp } from './mount';

afterEach(() => {
  document.body.innerHTML = '';
});

// A fan on an outlet damper (DESIGN.md's quick study case), 7.5 kW IE2, three flow bins.
const result = assess(
  {
    tag: 'F-21',
    ratedPowerKw: 7.5,
    poles: 4,
    efficiencyClass: 'IE2',
    application: 'fan',
    controlMethod: 'outlet-damper',
    loadFactor: 0.8,
    dutyProfile: [
      { fraction: 1, hours: 2000 },
      { fraction: 0.7, hours: 3000 },
      { fraction: 0.5, hours: 1500 },
    ],
  },
  { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.16, demandChargePerKwMonth: 5, currency: 'EUR', co2KgPerKwh: 0.25 },
);

describe('QuickStudyOptionsTable', { timeout: 20_000 }, () => {
  it('shows every option of calc’s result with calc’s own figures, formatted for the site’s currency', () => {
    const wrapper = mountWithApp(QuickStudyOptionsTable, createHarness('engineer'), { props: { result } });
    const rows = wrapper.findAll('[data-testid="study-options-table"] tbody tr');
    expect(rows.map((row) => row.attributes('data-code'))).toEqual(result.options.map((option) => option.code));
    for (const option of result.options) {
      const row = wrapper.get(`tr[data-code="${option.code}"]`);
      const cell = (field: string) => row.get(`td[data-field="${field}"]`);
      expect(Number(cell('annualKwh').attributes('data-value'))).toBe(option.annualKwh);
      expect(cell('annualKwh').text()).toBe(formatKwh(option.annualKwh));
      expect(Number(cell('capex').attributes('data-value'))).toBe(option.capex);
      expect(Number(cell('lineCurrentA').attributes('data-value'))).toBe(option.lineCurrentA);
      expect(Number(cell('kva').attributes('data-value'))).toBe(option.kva);
      if (option.code === 'keep') continue;
      expect(Number(cell('savingsKwh').attributes('data-value'))).toBe(option.savingsKwh);
      expect(Number(cell('savingsCost').attributes('data-value'))).toBe(option.savingsCost);
      expect(Number(cell('co2SavedKg').attributes('data-value'))).toBe(option.co2SavedKg);
      expect(Number(cell('npv').attributes('data-value'))).toBe(option.npv);
      expect(cell('npv').text()).toBe(formatMoney(option.npv, 'EUR'));
      expect(cell('simplePaybackYears').text()).toBe(formatYears(option.simplePaybackYears));
      expect(cell('irr').text()).toBe(formatIrr(option.irr));
    }
  });

  it('highlights the recommended option and states calc’s reason', () => {
    const wrapper = mountWithApp(QuickStudyOptionsTable, createHarness('viewer'), { props: { result } });
    expect(result.recommended.code).not.toBe('keep');
    const banner = wrapper.get('[data-testid="study-recommended"]');
    expect(banner.attributes('data-code')).toBe(result.recommended.code);
    expect(banner.text()).toContain(result.recommended.reason);
    expect(wrapper.get(`tr[data-code="${result.recommended.code}"]`).classes()).toContain('quick-study-options__row--recommended');
    expect(wrapper.findAll('.quick-study-options__row--recommended')).toHaveLength(1);
  });

  it('formats money with whole units for large sums, kWh with separators, payback with one decimal, IRR in %', () => {
    expect(formatMoney(12345.67, 'EUR')).toBe('€12,346');
    expect(formatMoney(42.5, 'EUR')).toBe('€42.50');
    expect(formatKwh(60842.1)).toBe('60,842 kWh');
    expect(formatYears(3.149)).toBe('3.1 a');
    expect(formatYears(null)).toBe('–');
    expect(formatIrr(0.2512)).toBe('25.1 %');
  });
});
