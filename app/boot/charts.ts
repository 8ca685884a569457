// Charts. ApexCharts is heavy, so it is never imported here: components/ChartPanel.vue loads
// vue3-apexcharts on demand (its own chunk), and this boot file only sets the app-wide chart look
// through ApexCharts' documented global `window.Apex` options, which the library reads when it loads.
import { defineBoot } from '#q-app/wrappers';
import { CHART_DEFAULTS } from 'components/chart-theme';

export default defineBoot(() => {
  (window as unknown as { Apex?: unknown }).Apex = CHART_DEFAULTS;
});
