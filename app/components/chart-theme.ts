// Statorline's chart look, shared by every chart (set globally in boot/charts.ts).

/** Series colours: the brand teal and copper first, then muted companions. */
export const CHART_COLOURS = ['#1f5f5b', '#c9822b', '#5b4b8a', '#6f8f3a', '#2f6690', '#8c5a44'];

/** ApexCharts' global options; `nonce` marks the <style> elements it adds as allowed by the CSP. */
export function chartDefaults(nonce?: string) {
  return {
    chart: {
      fontFamily: '"Open Sans", system-ui, sans-serif',
      foreColor: '#3c4a48',
      toolbar: { show: false },
      animations: { enabled: false },
      ...(nonce ? { nonce } : {}),
    },
    colors: CHART_COLOURS,
    grid: { borderColor: '#e3ddd2', strokeDashArray: 3 },
    dataLabels: { enabled: false },
    tooltip: { theme: 'light' },
  };
}
