/**
 * The business case as PDF, laid out by pdfmake 0.3 (on pdfkit) with the Open Sans fonts the app
 * ships (@fontsource/open-sans, its Latin .woff files: pdfkit reads WOFF, not WOFF2). Charts are
 * vector graphics drawn with pdfmake's canvas: savings and energy by site (bars), the cumulative cash
 * flow (lines) and the sensitivity of the payback (tornado bars).
 *
 * Pages: 1 summary, 2 charts, 3 sites, areas (feeders) and sensitivity, then the recommended retrofit
 * list, then the assumptions, sources and cautions (each section starts a page).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { projectRoot } from '../lib/config.js';
import type { BusinessCase } from '../models/index.js';
import type { CaseBar, CaseGroup, CaseItem, CaseResults } from '../shared/case.js';

/** The part of pdfmake's server API used here (the package ships no types). */
interface PdfMake {
  virtualfs: { writeFileSync(name: string, content: Buffer): void };
  setFonts(fonts: Record<string, Record<'normal' | 'bold' | 'italics' | 'bolditalics', string>>): void;
  setUrlAccessPolicy(policy: (url: string) => boolean): void;
  setLocalAccessPolicy(policy: (path: string) => boolean): void;
  createPdf(definition: Record<string, unknown>): { getBuffer(): Promise<Buffer> };
}
type Node = Record<string, unknown> | string;

/** Longest recommended list printed; beyond it the PDF says the full list is in the .xlsx export. */
export const PDF_MAX_ITEMS = 1000;

const FONT_FILES = {
  normal: 'open-sans-latin-400-normal.woff',
  bold: 'open-sans-latin-700-normal.woff',
  italics: 'open-sans-latin-400-italic.woff',
  bolditalics: 'open-sans-latin-700-italic.woff',
} as const;

let pdfmake: PdfMake | null = null;

/** pdfmake with the fonts loaded into its virtual file system; no file or URL access beyond that. */
function printer(): PdfMake {
  if (pdfmake) return pdfmake;
  const instance = createRequire(import.meta.url)('pdfmake') as PdfMake;
  const folder = join(projectRoot, 'node_modules', '@fontsource', 'open-sans', 'files');
  for (const file of Object.values(FONT_FILES)) instance.virtualfs.writeFileSync(file, readFileSync(join(folder, file)));
  instance.setFonts({ OpenSans: { ...FONT_FILES } });
  instance.setUrlAccessPolicy(() => false);
  instance.setLocalAccessPolicy(() => false);
  pdfmake = instance;
  return instance;
}

/** Characters outside the Latin subset of the shipped font, spelled with ones inside it. */
const REPLACEMENTS: Record<string, string> = { '≥': '>=', '≤': '<=', '√': 'sqrt', 'η': 'eta', 'φ': 'phi', '₂': '2', '→': '->', 'Σ': 'sum ', 'Δ': 'delta ', '≈': '~', '∙': '·' };
const pdfText = (value: string) => value.replace(/[≥≤√ηφ₂→ΣΔ≈∙]/g, (char) => REPLACEMENTS[char] ?? char);

const formats = new Map<number, Intl.NumberFormat>();
function fmt(value: number | null | undefined, decimals = 0): string {
  if (value === null || value === undefined) return '–';
  let format = formats.get(decimals);
  if (!format) formats.set(decimals, (format = new Intl.NumberFormat('en-GB', { minimumFractionDigits: decimals, maximumFractionDigits: decimals })));
  return format.format(value).replace('-', '−');
}
const pct = (rate: number | null) => (rate === null ? '–' : `${fmt(rate * 100, 1)} %`);
const years = (value: number | null) => (value === null ? 'never' : `${fmt(value, 1)} yr`);

const COLORS = { bar: '#2f6f8f', after: '#8fb8c9', line: '#2f6f8f', discounted: '#c2703d', axis: '#555555', grid: '#dddddd' };

function keyFigures(results: CaseResults, currency: string): Node {
  const t = results.totals;
  const rows: Array<[string, string]> = [
    ['Energy today', `${fmt(t.baselineKwh)} kWh/yr`],
    ['Energy after the recommended retrofits', `${fmt(t.afterKwh)} kWh/yr`],
    ['Energy saved', `${fmt(t.savingsKwh)} kWh/yr (${fmt(t.savingsPct, 1)} %)`],
    ['Cost saved (first year)', `${fmt(t.savingsCost)} ${currency}/yr`],
    ['CO2 avoided', `${fmt(t.co2SavedKg / 1000, 1)} t/yr`],
    ['Line current freed / apparent power freed', `${fmt(t.lineCurrentFreedA, 1)} A / ${fmt(t.kvaFreed, 1)} kVA`],
    ['Capex before rebates / rebates', `${fmt(t.grossCapex)} / ${fmt(t.rebates)} ${currency}`],
    ['Capex after rebates', `${fmt(t.capex)} ${currency}`],
    ['Simple payback / discounted payback', `${years(t.simplePaybackYears)} / ${years(t.discountedPaybackYears)}`],
    [`NPV over ${t.analysisYears} years at ${fmt(t.discountRatePct, 1)} %/yr`, `${fmt(t.npv)} ${currency}`],
    ['IRR', pct(t.irr)],
    ['Life-cycle cost: retrofits / kept as today', `${fmt(t.lifeCycleCost)} / ${fmt(t.lifeCycleCostToday)} ${currency}`],
    ['Motors: assessed / recommended for retrofit / not assessed', `${fmt(t.motors - t.failedMotors)} / ${fmt(t.recommendedMotors)} / ${fmt(t.failedMotors)}`],
  ];
  return {
    table: { widths: ['*', 'auto'], body: rows.map(([label, value]) => [label, { text: value, alignment: 'right', bold: true }]) },
    layout: 'lightHorizontalLines',
  };
}

/** Horizontal bars, one row per entry: label, bar (vector), value. */
function barChart(title: string, entries: Array<{ label: string; value: number; second?: number }>, unit: string, legend?: [string, string]): Node {
  const width = 260;
  const max = Math.max(1e-9, ...entries.flatMap((entry) => [entry.value, entry.second ?? 0]));
  const rows = entries.map((entry) => {
    const bars: Node[] = [{ type: 'rect', x: 0, y: 1, w: Math.max(0.5, (width * Math.max(0, entry.value)) / max), h: entry.second === undefined ? 10 : 6, color: COLORS.bar }];
    if (entry.second !== undefined) bars.push({ type: 'rect', x: 0, y: 8, w: Math.max(0.5, (width * Math.max(0, entry.second)) / max), h: 6, color: COLORS.after });
    return [
      { text: pdfText(entry.label), fontSize: 8 },
      { canvas: bars },
      { text: entry.second === undefined ? `${fmt(entry.value)} ${unit}` : `${fmt(entry.value)} → ${fmt(entry.second)} ${unit}`.replace('→', '->'), fontSize: 8, alignment: 'right' },
    ];
  });
  return {
    stack: [
      { text: title, style: 'chartTitle' },
      ...(legend ? [{ text: [{ text: '■ ', color: COLORS.bar }, `${legend[0]}   `, { text: '■ ', color: COLORS.after }, legend[1]], fontSize: 8, margin: [0, 0, 0, 4] }] : []),
      { table: { widths: [110, width, '*'], body: rows.length > 0 ? rows : [['no data', '', '']] }, layout: 'noBorders' },
    ],
    margin: [0, 0, 0, 14],
  };
}

/** Cumulative cash flow by year, undiscounted and discounted, as two polylines over a zero line. */
function cashFlowChart(results: CaseResults, currency: string): Node {
  const flows = results.charts.cashFlow;
  const width = 480;
  const height = 170;
  const values = flows.flatMap((year) => [year.cumulative, year.discountedCumulative]);
  const top = Math.max(0, ...values);
  const bottom = Math.min(0, ...values);
  const span = top - bottom || 1;
  const x = (year: number) => (flows.length > 1 ? (width * year) / (flows.length - 1) : 0);
  const y = (value: number) => height - (height * (value - bottom)) / span;
  const canvas: Node[] = [
    { type: 'line', x1: 0, y1: 0, x2: 0, y2: height, lineWidth: 0.5, lineColor: COLORS.axis },
    { type: 'line', x1: 0, y1: y(0), x2: width, y2: y(0), lineWidth: 0.8, lineColor: COLORS.axis },
  ];
  for (let year = 1; year < flows.length; year += 1) canvas.push({ type: 'line', x1: x(year), y1: y(0) - 2, x2: x(year), y2: y(0) + 2, lineWidth: 0.5, lineColor: COLORS.axis });
  if (flows.length > 1) {
    canvas.push({ type: 'polyline', lineWidth: 1.6, lineColor: COLORS.line, points: flows.map((year) => ({ x: x(year.year), y: y(year.cumulative) })) });
    canvas.push({ type: 'polyline', lineWidth: 1.2, lineColor: COLORS.discounted, dash: { length: 3 }, points: flows.map((year) => ({ x: x(year.year), y: y(year.discountedCumulative) })) });
  }
  const last = flows[flows.length - 1];
  return {
    stack: [
      { text: `Cumulative cash flow [${currency}]`, style: 'chartTitle' },
      { text: [{ text: '— ', color: COLORS.line, bold: true }, 'undiscounted   ', { text: '- - ', color: COLORS.discounted, bold: true }, `discounted at ${fmt(results.totals.discountRatePct, 1)} %/yr`], fontSize: 8, margin: [0, 0, 0, 4] },
      { text: `${fmt(top)} ${currency}`, fontSize: 7, color: COLORS.axis },
      { canvas },
      { text: `${fmt(bottom)} ${currency}`, fontSize: 7, color: COLORS.axis },
      {
        text: `Years 0 to ${flows.length - 1} (a tick per year). Year 0: ${fmt(flows[0]?.cashFlow ?? 0)} ${currency}; after ${flows.length - 1} years: ${fmt(last?.cumulative ?? 0)} ${currency} undiscounted, ${fmt(last?.discountedCumulative ?? 0)} ${currency} discounted (the NPV).`,
        fontSize: 8,
        margin: [0, 4, 0, 0],
      },
    ],
    margin: [0, 0, 0, 14],
  };
}

/** Tornado: for each factor, the simple payback at the lowest and highest step around the base. */
function tornadoChart(results: CaseResults): Node {
  const sensitivity = results.sensitivity;
  const base = sensitivity.base.simplePaybackYears;
  const paybacks = sensitivity.factors.flatMap((factor) => [factor.low.simplePaybackYears, factor.high.simplePaybackYears]).filter((v): v is number => v !== null);
  if (base === null || paybacks.length === 0) return { text: 'Sensitivity of the payback: the case has no payback to vary.', fontSize: 8 };
  const width = 240;
  const spread = Math.max(1e-9, ...paybacks.map((value) => Math.abs(value - base)));
  const xOf = (value: number) => width / 2 + ((value - base) / spread) * (width / 2 - 4);
  const rows = sensitivity.factors.map((factor) => {
    const canvas: Node[] = [{ type: 'line', x1: width / 2, y1: 0, x2: width / 2, y2: 14, lineWidth: 0.8, lineColor: COLORS.axis }];
    for (const [point, color] of [[factor.low, COLORS.after], [factor.high, COLORS.bar]] as const) {
      if (point.simplePaybackYears === null) continue;
      const x = xOf(point.simplePaybackYears);
      canvas.push({ type: 'rect', x: Math.min(x, width / 2), y: 2, w: Math.max(0.5, Math.abs(x - width / 2)), h: 10, color });
    }
    return [
      { text: factor.label, fontSize: 8 },
      { canvas },
      { text: `${factor.low.changePct} %: ${years(factor.low.simplePaybackYears)}; +${factor.high.changePct} %: ${years(factor.high.simplePaybackYears)}`, fontSize: 8 },
    ];
  });
  return {
    stack: [
      { text: `Sensitivity of the simple payback (base ${years(base)})`, style: 'chartTitle' },
      { text: [{ text: '■ ', color: COLORS.after }, 'lowest step   ', { text: '■ ', color: COLORS.bar }, 'highest step; the centre line is the base case'], fontSize: 8, margin: [0, 0, 0, 4] },
      { table: { widths: [90, width, '*'], body: rows }, layout: 'noBorders' },
    ],
    margin: [0, 0, 0, 14],
  };
}

function groupTable(groups: readonly CaseGroup[], currency: string, withArea: boolean): Node {
  const header = [
    withArea ? 'Site / area' : 'Site',
    'Motors',
    'Retrofits',
    'Today [MWh/yr]',
    'After [MWh/yr]',
    `Saved [${currency}/yr]`,
    'CO2 [t/yr]',
    'Current freed [A]',
    'kVA freed',
    `Capex [${currency}]`,
    'Payback [yr]',
  ];
  const body = groups.map((g) => [
    pdfText(withArea ? `${g.siteName} / ${g.area || '(no area)'}` : g.siteName),
    fmt(g.motors),
    fmt(g.recommendedMotors),
    fmt(g.baselineKwh / 1000, 1),
    fmt(g.afterKwh / 1000, 1),
    fmt(g.savingsCost),
    fmt(g.co2SavedKg / 1000, 1),
    fmt(g.lineCurrentFreedA, 1),
    fmt(g.kvaFreed, 1),
    fmt(g.capex),
    fmt(g.simplePaybackYears, 1),
  ]);
  return numericTable(header, body, ['*', 30, 36, 44, 44, 48, 34, 40, 34, 48, 36]);
}

function numericTable(header: string[], body: string[][], widths: Array<number | string>): Node {
  return {
    table: {
      headerRows: 1,
      widths,
      body: [header.map((text) => ({ text, style: 'tableHeader' })), ...body.map((row) => row.map((text, index) => (index === 0 ? text : { text, alignment: 'right' })))],
    },
    layout: 'lightHorizontalLines',
    fontSize: 7,
    margin: [0, 0, 0, 12],
  };
}

function sensitivityTable(results: CaseResults, currency: string): Node {
  const s = results.sensitivity;
  const row = (label: string, p: (typeof s)['base']) => [label, fmt(p.savingsCost), years(p.simplePaybackYears), years(p.discountedPaybackYears), fmt(p.npv), pct(p.irr)];
  return numericTable(
    ['Case', `Saved [${currency}/yr]`, 'Simple payback', 'Discounted payback', `NPV [${currency}]`, 'IRR'],
    [row('Base case', s.base), ...s.factors.flatMap((f) => f.points.map((p) => row(`${f.label} ${p.changePct > 0 ? '+' : ''}${p.changePct} %`, p)))],
    ['*', 60, 60, 70, 70, 50],
  );
}

function recommendedTable(items: readonly CaseItem[], currency: string): Node[] {
  const recommended = items.filter((item) => item.optionCode !== 'keep').sort((a, b) => b.npv - a.npv || a.tag.localeCompare(b.tag));
  const shown = recommended.slice(0, PDF_MAX_ITEMS);
  const body = shown.map((i) => [
    pdfText(i.tag),
    pdfText(i.siteName),
    pdfText(i.area ?? ''),
    i.application,
    fmt(i.ratedPowerKw, 1),
    pdfText(i.optionLabel),
    fmt(i.savingsKwh),
    fmt(i.savingsCost),
    fmt(i.kvaFreed, 2),
    fmt(i.capex),
    fmt(i.simplePaybackYears, 1),
    fmt(i.npv),
  ]);
  const nodes: Node[] = [
    { text: `Recommended retrofits (${fmt(recommended.length)} motors, by NPV)`, style: 'heading', pageBreak: 'before' },
    numericTable(['Tag', 'Site', 'Area', 'Application', 'kW', 'Option', 'Saved [kWh/yr]', `Saved [${currency}/yr]`, 'kVA freed', `Capex [${currency}]`, 'Payback [yr]', `NPV [${currency}]`], body, [44, 50, 40, 38, 24, '*', 42, 40, 30, 40, 30, 42]),
  ];
  if (recommended.length > shown.length) nodes.push({ text: `The ${fmt(shown.length)} retrofits of highest NPV are printed; the full list of ${fmt(recommended.length)} is in the .xlsx export.`, italics: true });
  if (recommended.length === 0) nodes.push({ text: 'No motor has a retrofit option with a positive NPV: keep them and review at their next failure.' });
  return nodes;
}

/** The document definition (exported for tests and the benchmark). */
export function caseDocument(row: BusinessCase): Record<string, unknown> {
  const results = row.results;
  const currency = row.currency;
  const charts = results.charts;
  const bars = (list: readonly CaseBar[]) => list.map((bar) => ({ label: bar.label, value: bar.savingsCost }));
  const content: Node[] = [
    { text: pdfText(`${row.title}: business case, version ${row.version}`), style: 'title' },
    {
      text: `Status ${row.status}. Generated ${row.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC from ${fmt(results.totals.motors)} register motors of ${results.perSite.length} site${results.perSite.length === 1 ? '' : 's'}; money in ${currency}.`,
      margin: [0, 0, 0, 10],
    },
    { text: 'Summary', style: 'heading' },
    keyFigures(results, currency),
    {
      text: `Each motor was assessed against every retrofit option; the option with the highest positive NPV is recommended, else the motor is kept. The case's payback, NPV and IRR come from the year-by-year sum of the recommended retrofits' cash flows.`,
      margin: [0, 10, 0, 0],
      fontSize: 8,
    },
    { text: 'Charts', style: 'heading', pageBreak: 'before' },
    barChart(`Cost saved by site [${currency}/yr]`, bars(charts.savingsBySite), currency),
    barChart('Energy by site [kWh/yr]', charts.energyBySite.map((site) => ({ label: site.label, value: site.baselineKwh, second: site.afterKwh })), 'kWh', ['today', 'after the retrofits']),
    cashFlowChart(results, currency),
    barChart(`Cost saved by option [${currency}/yr]`, bars(charts.savingsByOption), currency),
    barChart(`Cost saved by application [${currency}/yr]`, bars(charts.savingsByApplication), currency),
    { text: 'Sites', style: 'heading', pageBreak: 'before' },
    groupTable(results.perSite, currency, false),
    { text: 'Areas (feeders): what the transformer and cables gain', style: 'heading' },
    groupTable(results.perArea, currency, true),
    { text: 'Sensitivity', style: 'heading' },
    tornadoChart(results),
    sensitivityTable(results, currency),
    ...recommendedTable(results.items, currency),
    { text: 'Assumptions and their sources', style: 'heading', pageBreak: 'before' },
    numericTable(
      ['Assumption', 'Value', 'Source', 'Motors'],
      results.assumptions.map((a) => [pdfText(a.what), pdfText(String(a.value)), pdfText(a.source), fmt(a.motors)]),
      [110, 100, '*', 30],
    ),
    { text: 'Sources of the inputs', style: 'subheading' },
    { ul: results.sources.map((source) => pdfText(source)), fontSize: 8, margin: [0, 0, 0, 10] },
    ...(results.failed.length > 0
      ? [{ text: 'Motors not assessed', style: 'subheading' }, { ul: results.failed.slice(0, 200).map((f) => pdfText(`${f.tag} (${f.siteName}): ${f.message}`)), fontSize: 8, margin: [0, 0, 0, 10] }]
      : []),
    { text: 'Cautions', style: 'heading' },
    { ul: results.cautions.map((caution) => pdfText(caution)) },
  ];
  return {
    info: { title: pdfText(`${row.title} business case v${row.version}`), creator: 'Statorline', producer: 'Statorline' },
    pageSize: 'A4',
    pageMargins: [36, 40, 36, 44],
    defaultStyle: { font: 'OpenSans', fontSize: 9 },
    styles: {
      title: { fontSize: 17, bold: true, margin: [0, 0, 0, 6] },
      heading: { fontSize: 12, bold: true, margin: [0, 8, 0, 6] },
      subheading: { fontSize: 10, bold: true, margin: [0, 6, 0, 4] },
      chartTitle: { fontSize: 10, bold: true, margin: [0, 0, 0, 2] },
      tableHeader: { bold: true, fontSize: 7 },
    },
    footer: (page: number, pages: number) => ({
      text: pdfText(`Statorline · ${row.title} business case v${row.version} · page ${page} of ${pages}`),
      alignment: 'center',
      fontSize: 7,
      margin: [0, 16, 0, 0],
    }),
    content,
  };
}

/** The PDF of a business case. */
export async function casePdf(row: BusinessCase): Promise<Buffer> {
  return printer().createPdf(caseDocument(row)).getBuffer();
}
