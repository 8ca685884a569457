/**
 * The business case as an .xlsx workbook: a Summary sheet (case totals, per site, per area), one
 * sheet per site with its motors, and Sensitivity, Cash flow and Assumptions sheets. Numbers are
 * numeric cells, units are in the headers ("Savings [kWh/yr]"); text is neutralised so a spreadsheet
 * program never evaluates it as a formula.
 */
import * as XLSX from 'xlsx';
import { neutraliseFormula } from '../motors/export.js';
import type { BusinessCase } from '../models/index.js';
import type { CaseGroup, CaseItem } from '../shared/case.js';

type Cell = string | number | null;

const text = (value: string | null | undefined): Cell => (value === null || value === undefined ? null : neutraliseFormula(value));

/** Column headers of a site's motor sheet; `[C]` is replaced by the currency. */
export const ITEM_COLUMNS: ReadonlyArray<[string, (item: CaseItem) => Cell]> = [
  ['Tag', (i) => text(i.tag)],
  ['Description', (i) => text(i.description)],
  ['Area', (i) => text(i.area)],
  ['Application', (i) => i.application],
  ['Rated power [kW]', (i) => i.ratedPowerKw],
  ['Recommended option', (i) => i.optionLabel],
  ['Option code', (i) => i.optionCode],
  ['Energy today [kWh/yr]', (i) => i.baselineKwh],
  ['Energy after [kWh/yr]', (i) => i.afterKwh],
  ['Savings [kWh/yr]', (i) => i.savingsKwh],
  ['Cost today [C/yr]', (i) => i.baselineCost],
  ['Cost saved [C/yr]', (i) => i.savingsCost],
  ['CO2 avoided [kg/yr]', (i) => i.co2SavedKg],
  ['Line current before [A]', (i) => i.lineCurrentBeforeA],
  ['Line current after [A]', (i) => i.lineCurrentAfterA],
  ['Line current freed [A]', (i) => i.lineCurrentFreedA],
  ['Apparent power before [kVA]', (i) => i.kvaBefore],
  ['Apparent power after [kVA]', (i) => i.kvaAfter],
  ['Apparent power freed [kVA]', (i) => i.kvaFreed],
  ['Capex before rebates [C]', (i) => i.grossCapex],
  ['Rebates [C]', (i) => i.rebates],
  ['Capex [C]', (i) => i.capex],
  ['Life [yr]', (i) => i.lifeYears],
  ['Simple payback [yr]', (i) => i.simplePaybackYears],
  ['Discounted payback [yr]', (i) => i.discountedPaybackYears],
  ['NPV [C]', (i) => i.npv],
  ['IRR [%/yr]', (i) => (i.irr === null ? null : Math.round(i.irr * 10000) / 100)],
  ['Life-cycle cost [C]', (i) => i.lifeCycleCost],
];

export const GROUP_COLUMNS: ReadonlyArray<[string, (group: CaseGroup) => Cell]> = [
  ['Site', (g) => text(g.siteName)],
  ['Area', (g) => (g.area === null ? null : text(g.area || '(no area)'))],
  ['Motors', (g) => g.motors],
  ['Recommended retrofits', (g) => g.recommendedMotors],
  ['Installed [kW]', (g) => g.installedKw],
  ['Energy today [kWh/yr]', (g) => g.baselineKwh],
  ['Energy after [kWh/yr]', (g) => g.afterKwh],
  ['Savings [kWh/yr]', (g) => g.savingsKwh],
  ['Cost today [C/yr]', (g) => g.baselineCost],
  ['Cost saved [C/yr]', (g) => g.savingsCost],
  ['CO2 avoided [kg/yr]', (g) => g.co2SavedKg],
  ['Line current freed [A]', (g) => g.lineCurrentFreedA],
  ['Apparent power freed [kVA]', (g) => g.kvaFreed],
  ['Capex before rebates [C]', (g) => g.grossCapex],
  ['Rebates [C]', (g) => g.rebates],
  ['Capex [C]', (g) => g.capex],
  ['NPV (sum of items) [C]', (g) => g.npv],
  ['Simple payback [yr]', (g) => g.simplePaybackYears],
];

const withCurrency = (header: string, currency: string) => header.replace('[C', `[${currency}`);

/** A sheet name Excel accepts: at most 31 characters, none of []:*?/\, unique in the workbook. */
function sheetName(name: string, used: Set<string>): string {
  const base = name.replace(/[[\]:*?/\\]/g, ' ').trim().slice(0, 28) || 'Site';
  let candidate = base;
  for (let n = 2; used.has(candidate.toLowerCase()); n += 1) candidate = `${base.slice(0, 26)} ${n}`;
  used.add(candidate.toLowerCase());
  return candidate;
}

export function caseWorkbook(row: BusinessCase): Buffer {
  const results = row.results;
  const totals = results.totals;
  const currency = row.currency;
  const workbook = XLSX.utils.book_new();
  const used = new Set<string>();

  const totalsColumns: Array<[string, Cell]> = [
    ['Motors', totals.motors],
    ['Recommended retrofits', totals.recommendedMotors],
    ['Motors not assessed', totals.failedMotors],
    ['Installed [kW]', totals.installedKw],
    ['Energy today [kWh/yr]', totals.baselineKwh],
    ['Energy after [kWh/yr]', totals.afterKwh],
    ['Savings [kWh/yr]', totals.savingsKwh],
    ['Savings [%]', totals.savingsPct],
    ['Cost today [C/yr]', totals.baselineCost],
    ['Cost saved [C/yr]', totals.savingsCost],
    ['CO2 avoided [kg/yr]', totals.co2SavedKg],
    ['Line current freed [A]', totals.lineCurrentFreedA],
    ['Apparent power freed [kVA]', totals.kvaFreed],
    ['Capex before rebates [C]', totals.grossCapex],
    ['Rebates [C]', totals.rebates],
    ['Capex [C]', totals.capex],
    ['Simple payback [yr]', totals.simplePaybackYears],
    ['Discounted payback [yr]', totals.discountedPaybackYears],
    ['NPV [C]', totals.npv],
    ['IRR [%/yr]', totals.irr === null ? null : Math.round(totals.irr * 10000) / 100],
    ['Life-cycle cost, retrofits [C]', totals.lifeCycleCost],
    ['Life-cycle cost, kept as today [C]', totals.lifeCycleCostToday],
    ['Analysis period [yr]', totals.analysisYears],
    ['Discount rate [%/yr]', totals.discountRatePct],
    ['Energy price escalation [%/yr]', totals.energyEscalationPct],
  ];
  const summary: Cell[][] = [
    [text(`${row.title} business case, version ${row.version}`)],
    [`Status: ${row.status}; generated ${row.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC; currency ${currency}`],
    [],
    ['Case totals'],
    totalsColumns.map(([header]) => withCurrency(header, currency)),
    totalsColumns.map(([, value]) => value),
    [],
    ['Per site'],
    GROUP_COLUMNS.map(([header]) => withCurrency(header, currency)),
    ...results.perSite.map((group) => GROUP_COLUMNS.map(([, pick]) => pick(group))),
    [],
    ['Per area (feeder)'],
    GROUP_COLUMNS.map(([header]) => withCurrency(header, currency)),
    ...results.perArea.map((group) => GROUP_COLUMNS.map(([, pick]) => pick(group))),
    [],
    ['Cautions'],
    ...results.cautions.map((caution) => [caution]),
  ];
  XLSX.utils.book_append_sheet(workbook, XLSX.utils.aoa_to_sheet(summary), sheetName('Summary', used));

  for (const site of results.perSite) {
    const items = results.items.filter((item) => item.siteId === site.siteId);
    const rows: Cell[][] = [ITEM_COLUMNS.map(([header]) => withCurrency(header, currency)), ...items.map((item) => ITEM_COLUMNS.map(([, pick]) => pick(item)))];
    XLSX.utils.book_append_sheet(workbook, XLSX.utils.aoa_to_sheet(rows), sheetName(site.siteName, used));
  }

  const sensitivity: Cell[][] = [
    ['Factor', 'Change [%]', `Cost saved [${currency}/yr]`, 'Simple payback [yr]', 'Discounted payback [yr]', `NPV [${currency}]`, 'IRR [%/yr]'],
    ['Base case', 0, results.sensitivity.base.savingsCost, results.sensitivity.base.simplePaybackYears, results.sensitivity.base.discountedPaybackYears, results.sensitivity.base.npv, results.sensitivity.base.irr === null ? null : Math.round(results.sensitivity.base.irr * 10000) / 100],
    ...results.sensitivity.factors.flatMap((factor) =>
      factor.points.map((point) => [factor.label, point.changePct, point.savingsCost, point.simplePaybackYears, point.discountedPaybackYears, point.npv, point.irr === null ? null : Math.round(point.irr * 10000) / 100]),
    ),
  ];
  XLSX.utils.book_append_sheet(workbook, XLSX.utils.aoa_to_sheet(sensitivity), sheetName('Sensitivity', used));

  const cashFlow: Cell[][] = [
    ['Year', `Cash flow [${currency}]`, `Cumulative [${currency}]`, `Discounted cumulative [${currency}]`],
    ...results.charts.cashFlow.map((year) => [year.year, year.cashFlow, year.cumulative, year.discountedCumulative]),
  ];
  XLSX.utils.book_append_sheet(workbook, XLSX.utils.aoa_to_sheet(cashFlow), sheetName('Cash flow', used));

  const assumptions: Cell[][] = [
    ['Assumption', 'Value', 'Source', 'Motors'],
    ...results.assumptions.map((a) => [text(a.what), typeof a.value === 'number' ? a.value : text(a.value), text(a.source), a.motors]),
    [],
    ['Sources of the inputs'],
    ...results.sources.map((source) => [text(source)]),
    ...(results.failed.length > 0 ? [[], ['Motors not assessed', 'Site', 'Reason'], ...results.failed.map((f) => [text(f.tag), text(f.siteName), text(f.message)])] : []),
  ];
  XLSX.utils.book_append_sheet(workbook, XLSX.utils.aoa_to_sheet(assumptions), sheetName('Assumptions', used));

  return XLSX.write(workbook, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
}
