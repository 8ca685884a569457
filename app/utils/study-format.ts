// Figures of studies and screenings as a plant engineer reads them: money in the site's currency
// (whole units for large sums), kWh with thousands separators, payback in years with one decimal,
// IRR in percent.
import { formatNumber } from './format';

const LOCALE = 'en-GB';

/** Money in `currency`: whole units from 100 up, cents below; no currency: the bare number. */
export function formatMoney(value: number, currency: string | null | undefined): string {
  const digits = Math.abs(value) >= 100 ? 0 : 2;
  if (!currency) return formatNumber(value, digits);
  try {
    return new Intl.NumberFormat(LOCALE, { style: 'currency', currency, minimumFractionDigits: digits, maximumFractionDigits: digits }).format(value);
  } catch {
    return `${formatNumber(value, digits)} ${currency}`;
  }
}

/** Energy [kWh], whole kilowatt-hours with separators. */
export function formatKwh(value: number): string {
  return `${formatNumber(value, 0)} kWh`;
}

/** CO2 mass [kg] as tonnes from one tonne up. */
export function formatCo2(kg: number): string {
  return Math.abs(kg) >= 1000 ? `${formatNumber(kg / 1000, 1)} t` : `${formatNumber(kg, 0)} kg`;
}

/** Years with one decimal; null (never pays back) as a dash. */
export function formatYears(value: number | null): string {
  return value === null ? '–' : `${new Intl.NumberFormat(LOCALE, { minimumFractionDigits: 1, maximumFractionDigits: 1 }).format(value)} a`;
}

/** IRR [-] as a percentage with one decimal; null (none) as a dash. */
export function formatIrr(value: number | null): string {
  return value === null ? '–' : `${new Intl.NumberFormat(LOCALE, { minimumFractionDigits: 1, maximumFractionDigits: 1 }).format(value * 100)} %`;
}

export function formatAmps(value: number): string {
  return `${formatNumber(value, 1)} A`;
}

export function formatKva(value: number): string {
  return `${formatNumber(value, 1)} kVA`;
}

/** A fraction [-] as a percentage. */
export function formatPercent(fraction: number, digits = 0): string {
  return `${formatNumber(fraction * 100, digits)} %`;
}
