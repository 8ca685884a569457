// Charts. ApexCharts is heavy, so it is never imported here: components/ChartPanel.vue loads
// vue3-apexcharts on demand (its own chunk, with apexcharts.css as a file), and this boot file only
// prepares the page for it:
// - the app-wide chart look, through ApexCharts' documented global `window.Apex` options, which the
//   library reads when it loads;
// - an element with the id `apexcharts-css`: ApexCharts injects its stylesheet as an inline <style>
//   unless that id exists, and the content security policy refuses inline styles;
// - the page's CSP nonce (the server writes it into <meta name="csp-nonce">) for the one small
//   <style> ApexCharts still adds to each chart's legend.
import { defineBoot } from '#q-app/wrappers';
import { chartDefaults } from 'components/chart-theme';

export const APEXCHARTS_CSS_MARKER_ID = 'apexcharts-css';

export default defineBoot(() => {
  const nonce = document.querySelector<HTMLMetaElement>('meta[name="csp-nonce"]')?.content;
  (window as unknown as { Apex?: unknown }).Apex = chartDefaults(nonce || undefined);
  if (!document.getElementById(APEXCHARTS_CSS_MARKER_ID)) {
    const marker = document.createElement('meta');
    marker.id = APEXCHARTS_CSS_MARKER_ID;
    marker.name = 'apexcharts-css-loaded-as-file';
    document.head.appendChild(marker);
  }
});
