import { describe, expect, it } from 'vitest';
import { tornadoChart, tornadoRows } from 'components/case-charts';
import { caseScopeLabel, formatEnergy, formatMoney, formatRate, formatYears, headlineTiles, splitAddresses } from 'components/case-format';
import { pipelineParts } from 'components/overview-pipeline';
import type { OverviewFigures } from 'shared/overview';
import { dairyCase } from './case-fixtures';

describe('business-case formatting', () => {
  it('writes money in the case’s currency, whole above 100 and with cents below', () => {
    expect(formatMoney(48_300.4, 'EUR')).toBe('€48,300');
    expect(formatMoney(12.5, 'USD')).toBe('US$12.50');
    expect(formatMoney(-9_800, 'GBP', 0)).toBe('-£9,800');
  });

  it('writes energy in kWh below 10 MWh and in MWh above', () => {
    expect(formatEnergy(9_999)).toBe('9,999 kWh/yr');
    expect(formatEnergy(176_000)).toBe('176 MWh/yr');
    expect(formatEnergy(1_234_567)).toBe('1,234.6 MWh/yr');
  });

  it('says when an investment does not pay back, and shows an IRR as a percentage', () => {
    expect(formatYears(1.274)).toBe('1.3 yr');
    expect(formatYears(null)).toBe('Does not pay back');
    expect(formatYears(1)).toBe('1.0 yr');
    expect(formatRate(0.1234)).toBe('12.3 %');
    expect(formatRate(null)).toBe('—');
  });

  it('builds the headline tiles a plant manager reads first', () => {
    const tiles = Object.fromEntries(headlineTiles(dairyCase.results.totals).map((tile) => [tile.name, tile]));
    expect(Object.keys(tiles)).toEqual(['energy', 'cost', 'co2', 'kva', 'capex', 'payback', 'npv', 'irr', 'lcc']);
    expect(tiles.energy?.value).toBe('176 MWh/yr → 133 MWh/yr');
    expect(tiles.energy?.caption).toBe('43 MWh/yr saved (24.4 %)');
    expect(tiles.cost?.value).toBe('€7,740');
    expect(tiles.co2?.value).toBe('12.9 t/yr');
    expect(tiles.kva?.value).toBe('7.2 kVA');
    expect(tiles.kva?.caption).toBe('10.5 A of line current');
    expect(tiles.capex?.value).toBe('€9,800');
    expect(tiles.capex?.caption).toBe('€10,800 less €1,000 rebates');
    expect(tiles.payback?.value).toBe('1.3 yr');
    expect(tiles.payback?.caption).toBe('Discounted: 1.4 yr');
    expect(tiles.npv?.value).toBe('€62,500');
    expect(tiles.irr?.value).toBe('78 %');
    expect(tiles.lcc?.value).toBe('€190,000');
    expect(tiles.lcc?.caption).toBe('vs €290,000 keeping these motors as they are');
  });

  it('names the whole organisation’s case as such', () => {
    expect(caseScopeLabel({ scope: 'all', title: 'Kestrel Valley Foods' })).toBe('Whole organisation');
    expect(caseScopeLabel({ scope: 'site', title: 'Dairy plant' })).toBe('Dairy plant');
  });

  it('splits typed addresses on commas, semicolons and spaces, without repeats', () => {
    expect(splitAddresses(' a@x.example, b@x.example;a@x.example\nc@x.example ')).toEqual(['a@x.example', 'b@x.example', 'c@x.example']);
    expect(splitAddresses('  ')).toEqual([]);
  });
});

describe('business-case charts', () => {
  it('orders the tornado widest first and draws a payback that never comes at the end of the period', () => {
    const sensitivity = structuredClone(dairyCase.results.sensitivity);
    const rows = tornadoRows(sensitivity, 15);
    expect(rows.map((row) => row.label)).toEqual(['Operating hours', 'Energy price']);
    expect(rows[0]?.spread).toBeCloseTo(0.59, 10);

    sensitivity.factors[1]!.low.simplePaybackYears = null;
    const chart = tornadoChart(sensitivity, 15);
    const lowered = chart.series[0]!.data as { x: string; y: [number, number] }[];
    expect(lowered[0]).toMatchObject({ x: 'Energy price', y: [1.27, 15] });
    const raised = chart.series[1]!.data as { x: string; y: [number, number] }[];
    // Raising the energy price shortens the payback: the bar runs from there to the base.
    expect(raised.find((bar) => bar.x === 'Energy price')?.y).toEqual([1.06, 1.27]);
  });
});

describe('savings pipeline', () => {
  const figures = (identified: number, approved: number, installed: number, verified: number): OverviewFigures => ({
    currency: 'EUR',
    energyTodayKwh: 1e6,
    energyCostToday: 180_000,
    co2TodayKg: 3e5,
    unassessedMotors: 0,
    identified: { kwh: identified, cost: 0, motors: 10, source: 'case' },
    approved: { kwh: approved, cost: 0, retrofits: 4 },
    installed: { kwh: installed, cost: 0, retrofits: 2 },
    verified: { kwh: verified, cost: 0, retrofits: 1 },
  });

  it('splits the cumulative stages into parts that add up to what was identified', () => {
    const parts = pipelineParts(figures(100_000, 60_000, 30_000, 10_000));
    expect(parts).toEqual({ verified: 10_000, installed: 20_000, approved: 30_000, identified: 40_000 });
    expect(parts.verified + parts.installed + parts.approved + parts.identified).toBe(100_000);
  });

  it('never draws a negative part when a later stage exceeds an earlier one', () => {
    // Verified (metered) savings can exceed the prediction that was approved.
    const parts = pipelineParts(figures(50_000, 40_000, 40_000, 45_000));
    expect(Object.values(parts).every((value) => value >= 0)).toBe(true);
    expect(parts).toEqual({ verified: 45_000, installed: 0, approved: 0, identified: 5_000 });
  });
});
