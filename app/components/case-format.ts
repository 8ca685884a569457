// Display of business-case figures: money in the case's currency, energy in kWh or MWh, years,
// percentages; and the headline tiles a plant manager reads first. Pure functions (tested in
// tests/app/case-format.test.ts).
import type { CaseStatus, CaseSummary, CaseTotals } from 'shared/case';
import { formatNumber } from 'src/utils/format';

const LOCALE = 'en-GB';
const DASH = '—';

/** Whole money in the case's currency ("€48,300"); cents only below 100. */
export function formatMoney(value: number, currency: string, fractionDigits?: number): string {
  const digits = fractionDigits ?? (Math.abs(value) < 100 ? 2 : 0);
  try {
    return new Intl.NumberFormat(LOCALE, {
      style: 'currency',
      currency,
      minimumFractionDigits: digits,
      maximumFractionDigits: digits,
    }).format(value);
  } catch {
    return `${formatNumber(value, digits)} ${currency}`;
  }
}

/** Energy per year: kWh below 10 MWh, MWh with one decimal above (a tile must stay short). */
export function formatEnergy(kwh: number): string {
  if (Math.abs(kwh) < 10_000) return `${formatNumber(kwh)} kWh/yr`;
  return `${formatNumber(kwh / 1000, 1)} MWh/yr`;
}

/** CO2 per year in tonnes (kg below one tonne). */
export function formatCo2(kg: number): string {
  if (Math.abs(kg) < 1000) return `${formatNumber(kg)} kg/yr`;
  return `${formatNumber(kg / 1000, 1)} t/yr`;
}

/** A payback time; null means the investment does not pay back within its life. */
export function formatYears(years: number | null, never = 'Does not pay back'): string {
  if (years === null || !Number.isFinite(years)) return never;
  return `${new Intl.NumberFormat(LOCALE, { minimumFractionDigits: 1, maximumFractionDigits: 1 }).format(years)} yr`;
}

/** A number with exactly `digits` decimals, so that a column of figures lines up ("517.0"). */
export function formatFixed(value: number, digits = 1): string {
  return new Intl.NumberFormat(LOCALE, { minimumFractionDigits: digits, maximumFractionDigits: digits }).format(value);
}

/** Short money for chart axes ("€150K", "€1.2M"). */
export function formatMoneyShort(value: number, currency: string): string {
  try {
    return new Intl.NumberFormat(LOCALE, { style: 'currency', currency, notation: 'compact', maximumFractionDigits: 1 }).format(value);
  } catch {
    return `${new Intl.NumberFormat(LOCALE, { notation: 'compact', maximumFractionDigits: 1 }).format(value)} ${currency}`;
  }
}

/** A rate given as a fraction (0.25 → "25.0 %"); null → "—". */
export function formatRate(fraction: number | null): string {
  if (fraction === null || !Number.isFinite(fraction)) return DASH;
  return `${formatNumber(fraction * 100, 1)} %`;
}

/** A percentage already in % (12.3 → "12.3 %"). */
export function formatPct(pct: number): string {
  return `${formatNumber(pct, 1)} %`;
}

export function formatKva(kva: number): string {
  return `${formatNumber(kva, Math.abs(kva) < 100 ? 1 : 0)} kVA`;
}

export function formatAmps(amps: number): string {
  return `${formatNumber(amps, Math.abs(amps) < 100 ? 1 : 0)} A`;
}

/** A case's scope as people say it. */
export function caseScopeLabel(summary: Pick<CaseSummary, 'scope' | 'title'>): string {
  return summary.scope === 'all' ? 'Whole organisation' : summary.title;
}

/** Our wording and badge colours (Quasar brand/palette names) for a case's status. */
export const CASE_STATUS_LOOK: Record<CaseStatus, { label: string; color: string; icon: string; hint: string }> = {
  draft: { label: 'Draft', color: 'grey-7', icon: 'edit_note', hint: 'Generated, not yet e-mailed to the approvers' },
  sent: { label: 'Awaiting decision', color: 'info', icon: 'outgoing_mail', hint: 'E-mailed to the approvers' },
  approved: { label: 'Approved', color: 'positive', icon: 'task_alt', hint: 'An approver approved it' },
  rejected: { label: 'Rejected', color: 'negative', icon: 'block', hint: 'An approver rejected it' },
};

export interface HeadlineTile {
  /** The `case-headline-<name>` test id. */
  name: string;
  label: string;
  value: string;
  caption: string;
  icon: string;
}

/** The headline tiles of a report, in reading order. */
export function headlineTiles(totals: CaseTotals): HeadlineTile[] {
  const money = (value: number) => formatMoney(value, totals.currency, 0);
  const rebateText = totals.rebates > 0 ? `${money(totals.grossCapex)} less ${money(totals.rebates)} rebates` : 'No rebates counted';
  return [
    {
      name: 'energy',
      label: 'Energy, today → after',
      value: `${formatEnergy(totals.baselineKwh)} → ${formatEnergy(totals.afterKwh)}`,
      caption: `${formatEnergy(totals.savingsKwh)} saved (${formatPct(totals.savingsPct)})`,
      icon: 'bolt',
    },
    {
      name: 'cost',
      label: 'Cost saved per year',
      value: money(totals.savingsCost),
      caption: `of ${money(totals.baselineCost)} spent today`,
      icon: 'savings',
    },
    { name: 'co2', label: 'CO2 avoided', value: formatCo2(totals.co2SavedKg), caption: 'at each site’s grid factor', icon: 'eco' },
    {
      name: 'kva',
      label: 'Supply capacity freed',
      value: formatKva(totals.kvaFreed),
      caption: `${formatAmps(totals.lineCurrentFreedA)} of line current`,
      icon: 'electrical_services',
    },
    { name: 'capex', label: 'Capex, net of rebates', value: money(totals.capex), caption: rebateText, icon: 'payments' },
    {
      name: 'payback',
      label: 'Payback',
      value: formatYears(totals.simplePaybackYears),
      caption: `Discounted: ${formatYears(totals.discountedPaybackYears, 'not within the life')}`,
      icon: 'hourglass_bottom',
    },
    {
      name: 'npv',
      label: 'Net present value',
      value: money(totals.npv),
      caption: `${formatPct(totals.discountRatePct)} discount rate, ${totals.analysisYears} years`,
      icon: 'trending_up',
    },
    { name: 'irr', label: 'Internal rate of return', value: formatRate(totals.irr), caption: 'per year', icon: 'percent' },
    {
      name: 'lcc',
      label: 'Life-cycle cost',
      value: money(totals.lifeCycleCost),
      caption: `vs ${money(totals.lifeCycleCostToday)} keeping these motors as they are`,
      icon: 'account_balance',
    },
  ];
}

/** Typed e-mail addresses, split on commas, semicolons and white space, without repeats. */
export function splitAddresses(text: string): string[] {
  return [...new Set(text.split(/[\s,;]+/).map((part) => part.trim()).filter(Boolean))];
}
