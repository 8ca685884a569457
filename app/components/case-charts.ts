// The business-case report's charts as ApexCharts series and options, built from the snapshot's
// `charts` and `sensitivity` (pure functions; tested in tests/app/case-format.test.ts).
import type { ApexOptions } from 'apexcharts';
import type { CaseBar, CaseCharts, CaseSensitivity, CaseTotals, SensitivityPoint } from 'shared/case';
import { formatNumber } from 'src/utils/format';
import { formatMoney, formatMoneyShort, formatYears } from './case-format';

/** Colours of the tornado's two sides: factor lowered (copper) and raised (teal). */
const LOWER_COLOUR = '#c9822b';
const RAISED_COLOUR = '#1f5f5b';

export interface TornadoRow {
  label: string;
  /** Steps of the extremes [%] (−20, +20). */
  lowPct: number;
  highPct: number;
  /** Simple payback at the extremes [yr]; null: does not pay back. */
  lowYears: number | null;
  highYears: number | null;
  /** Spread of the bar [yr] (rows sorted by it, widest first). */
  spread: number;
}

/** Payback for the chart: "never" drawn at the end of the analysis period. */
function drawable(years: number | null, capYears: number): number {
  return years === null || !Number.isFinite(years) ? capYears : Math.min(years, capYears);
}

export function tornadoRows(sensitivity: CaseSensitivity, capYears: number): TornadoRow[] {
  return sensitivity.factors
    .map((factor) => ({
      label: factor.label,
      lowPct: factor.low.changePct,
      highPct: factor.high.changePct,
      lowYears: factor.low.simplePaybackYears,
      highYears: factor.high.simplePaybackYears,
      spread: Math.abs(drawable(factor.low.simplePaybackYears, capYears) - drawable(factor.high.simplePaybackYears, capYears)),
    }))
    .sort((a, b) => b.spread - a.spread);
}

const escapeHtml = (text: string) =>
  text.replace(/[&<>"']/g, (char) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[char] ?? char);

const signed = (pct: number) => `${pct > 0 ? '+' : pct < 0 ? '−' : '±'}${formatNumber(Math.abs(pct))} %`;

/**
 * A tornado of simple payback: per factor, a bar from the base payback to the payback with the
 * factor lowered, and one to the payback with it raised (ApexCharts horizontal range bars).
 */
export function tornadoChart(sensitivity: CaseSensitivity, capYears: number): { series: ApexAxisChartSeries; options: ApexOptions } {
  const base = drawable(sensitivity.base.simplePaybackYears, capYears);
  const rows = tornadoRows(sensitivity, capYears);
  const range = (years: number | null): [number, number] => {
    const value = drawable(years, capYears);
    return [Math.min(base, value), Math.max(base, value)];
  };
  const lowPct = rows[0]?.lowPct ?? -20;
  const highPct = rows[0]?.highPct ?? 20;
  const series: ApexAxisChartSeries = [
    { name: `Factor ${signed(lowPct)}`, data: rows.map((row) => ({ x: row.label, y: range(row.lowYears), fillColor: LOWER_COLOUR })) },
    { name: `Factor ${signed(highPct)}`, data: rows.map((row) => ({ x: row.label, y: range(row.highYears), fillColor: RAISED_COLOUR })) },
  ];
  const options: ApexOptions = {
    chart: { id: 'case-tornado', type: 'rangeBar' },
    colors: [LOWER_COLOUR, RAISED_COLOUR],
    plotOptions: { bar: { horizontal: true, barHeight: '55%', rangeBarOverlap: true } },
    xaxis: {
      title: { text: 'Simple payback (years)' },
      labels: { formatter: (value: string) => formatNumber(Number(value), 1) },
    },
    annotations: {
      xaxis: [
        {
          x: base,
          borderColor: '#173f3c',
          strokeDashArray: 4,
          label: { text: `Base ${formatYears(sensitivity.base.simplePaybackYears, 'never')}`, orientation: 'horizontal' },
        },
      ],
    },
    legend: { position: 'bottom' },
    tooltip: {
      custom: ({ seriesIndex, dataPointIndex }: { seriesIndex: number; dataPointIndex: number }) => {
        const row = rows[dataPointIndex];
        if (!row) return '';
        const pct = seriesIndex === 0 ? row.lowPct : row.highPct;
        const years = seriesIndex === 0 ? row.lowYears : row.highYears;
        return `<div class="apexcharts-tooltip-title">${escapeHtml(row.label)} ${signed(pct)}</div><div class="apexcharts-tooltip-series-group apexcharts-active">Payback ${formatYears(years, 'never')}</div>`;
      },
    },
  };
  return { series, options };
}

/** Cumulative cash flow, plain and discounted, with the payback point marked. */
export function cashFlowChart(charts: CaseCharts, totals: CaseTotals): { series: ApexAxisChartSeries; options: ApexOptions } {
  const money = (value: number) => formatMoney(value, totals.currency, 0);
  const series: ApexAxisChartSeries = [
    { name: 'Cumulative cash flow', data: charts.cashFlow.map((year) => ({ x: year.year, y: Math.round(year.cumulative) })) },
    {
      name: 'Discounted cumulative',
      data: charts.cashFlow.map((year) => ({ x: year.year, y: Math.round(year.discountedCumulative) })),
    },
  ];
  const payback = totals.simplePaybackYears;
  const points: NonNullable<ApexAnnotations['points']> =
    payback !== null && Number.isFinite(payback)
      ? [
          {
            x: payback,
            y: 0,
            marker: { size: 6, fillColor: '#c9822b', strokeColor: '#fff' },
            label: { text: `Pays back after ${formatYears(payback)}`, borderColor: '#c9822b', offsetY: -6, offsetX: 60 },
          },
        ]
      : [];
  const options: ApexOptions = {
    chart: { id: 'case-cashflow', type: 'line' },
    stroke: { width: [3, 2], curve: 'straight', dashArray: [0, 5] },
    markers: { size: 0 },
    xaxis: {
      type: 'numeric',
      tickAmount: Math.min(charts.cashFlow.length - 1, 20),
      title: { text: 'Year' },
      labels: { formatter: (value: string) => formatNumber(Number(value)) },
    },
    yaxis: { title: { text: totals.currency }, labels: { formatter: (value: number) => formatMoneyShort(value, totals.currency) } },
    annotations: { yaxis: [{ y: 0, borderColor: '#66706e', strokeDashArray: 0 }], points },
    legend: { position: 'bottom' },
    tooltip: { shared: true, x: { formatter: (value: number) => `Year ${value}` }, y: { formatter: (value: number) => money(value) } },
  };
  return { series, options };
}

/** Savings per year as horizontal bars (by site, application or option), largest first. */
export function savingsBarsChart(
  bars: CaseBar[],
  currency: string,
  id: string,
  labelOf: (bar: CaseBar) => string = (bar) => bar.label,
): { series: ApexAxisChartSeries; options: ApexOptions } {
  const rows = [...bars].sort((a, b) => b.savingsCost - a.savingsCost);
  const series: ApexAxisChartSeries = [{ name: `Savings (${currency}/yr)`, data: rows.map((row) => Math.round(row.savingsCost)) }];
  const options: ApexOptions = {
    chart: { id },
    plotOptions: { bar: { horizontal: true, borderRadius: 3, barHeight: '60%' } },
    xaxis: {
      categories: rows.map(labelOf),
      tickAmount: 3,
      labels: { formatter: (value: string) => formatMoneyShort(Number(value), currency) },
    },
    yaxis: { labels: { maxWidth: 170 } },
    tooltip: {
      y: {
        formatter: (value: number, context?: { dataPointIndex: number }) => {
          const row = context ? rows[context.dataPointIndex] : undefined;
          const money = formatMoney(value, currency, 0);
          return row ? `${money}/yr · ${formatNumber(row.savingsKwh)} kWh/yr · ${formatNumber(row.motors)} motors` : money;
        },
      },
    },
  };
  return { series, options };
}

/** Energy per site today and after the retrofits (grouped bars, MWh/yr). */
export function energyBySiteChart(charts: CaseCharts): { series: ApexAxisChartSeries; options: ApexOptions } {
  const mwh = (kwh: number) => Math.round(kwh / 100) / 10;
  const series: ApexAxisChartSeries = [
    { name: 'Today', data: charts.energyBySite.map((site) => mwh(site.baselineKwh)) },
    { name: 'After retrofits', data: charts.energyBySite.map((site) => mwh(site.afterKwh)) },
  ];
  const options: ApexOptions = {
    chart: { id: 'case-energy-by-site' },
    colors: ['#8c5a44', '#1f5f5b'],
    plotOptions: { bar: { horizontal: false, columnWidth: '55%', borderRadius: 3 } },
    xaxis: { categories: charts.energyBySite.map((site) => site.label) },
    yaxis: { title: { text: 'MWh/yr' }, labels: { formatter: (value: number) => formatNumber(value) } },
    legend: { position: 'bottom' },
    tooltip: { y: { formatter: (value: number) => `${formatNumber(value, 1)} MWh/yr` } },
  };
  return { series, options };
}

/** A sensitivity point's figures as table cells. */
export function sensitivityCells(point: SensitivityPoint, currency: string) {
  return {
    change: signed(point.changePct),
    savings: formatMoney(point.savingsCost, currency, 0),
    payback: formatYears(point.simplePaybackYears, 'never'),
    discounted: formatYears(point.discountedPaybackYears, 'not within life'),
    npv: formatMoney(point.npv, currency, 0),
  };
}
