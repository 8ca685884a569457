// Number, money and date formatting for display (en-GB, the app's language).

const LOCALE = 'en-GB';

export function formatNumber(value: number, maximumFractionDigits = 0): string {
  return new Intl.NumberFormat(LOCALE, { maximumFractionDigits }).format(value);
}

/** Power in kW: one decimal below 100 kW, whole kilowatts above. */
export function formatKw(value: number): string {
  return `${formatNumber(value, Math.abs(value) < 100 ? 1 : 0)} kW`;
}

/** A price in the site's currency with up to four decimals (energy prices are fractions of a unit). */
export function formatPrice(value: number, currency: string, maximumFractionDigits = 4): string {
  try {
    return new Intl.NumberFormat(LOCALE, { style: 'currency', currency, maximumFractionDigits }).format(value);
  } catch {
    return `${formatNumber(value, maximumFractionDigits)} ${currency}`;
  }
}

export function formatDateTime(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  return new Intl.DateTimeFormat(LOCALE, { dateStyle: 'medium', timeStyle: 'short' }).format(date);
}

export function formatDate(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  return new Intl.DateTimeFormat(LOCALE, { dateStyle: 'medium' }).format(date);
}

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${formatNumber(bytes / 1024, 1)} kB`;
  return `${formatNumber(bytes / (1024 * 1024), 1)} MB`;
}

/** "fan" → "Fan", "direct-on-line" → "Direct on line". */
export function humanize(code: string): string {
  const text = code.replace(/[-_]+/g, ' ');
  return text.charAt(0).toUpperCase() + text.slice(1);
}
