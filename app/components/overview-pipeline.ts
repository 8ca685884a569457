// The savings pipeline of the Overview: identified → approved → installed → verified, per site.
// The server's stages are cumulative (approved includes what is installed, installed what is
// verified); a stacked bar needs the disjoint parts, which this computes.
import type { ApexOptions } from 'apexcharts';
import type { OverviewFigures } from 'shared/overview';
import { formatNumber } from 'src/utils/format';

export const PIPELINE_STAGES = [
  { key: 'verified', label: 'Verified', colour: '#2e7d32' },
  { key: 'installed', label: 'Installed, not yet verified', colour: '#1f5f5b' },
  { key: 'approved', label: 'Approved, not yet installed', colour: '#2f6690' },
  { key: 'identified', label: 'Identified, not yet approved', colour: '#c9822b' },
] as const;

export type PipelineStage = (typeof PIPELINE_STAGES)[number]['key'];

/** The disjoint parts of a site's pipeline [kWh/yr]; never negative. */
export function pipelineParts(figures: OverviewFigures): Record<PipelineStage, number> {
  const verified = Math.max(0, figures.verified.kwh);
  const installed = Math.max(verified, figures.installed.kwh);
  const approved = Math.max(installed, figures.approved.kwh);
  const identified = Math.max(approved, figures.identified.kwh);
  return {
    verified,
    installed: installed - verified,
    approved: approved - installed,
    identified: identified - approved,
  };
}

export interface PipelineRow {
  label: string;
  figures: OverviewFigures;
}

/** A stacked horizontal bar per row (site), MWh/yr. */
export function pipelineChart(rows: PipelineRow[]): { series: ApexAxisChartSeries; options: ApexOptions } {
  const parts = rows.map((row) => pipelineParts(row.figures));
  const series: ApexAxisChartSeries = PIPELINE_STAGES.map((stage) => ({
    name: stage.label,
    data: parts.map((part) => Math.round(part[stage.key] / 100) / 10),
  }));
  const options: ApexOptions = {
    chart: { id: 'overview-pipeline', stacked: true },
    colors: PIPELINE_STAGES.map((stage) => stage.colour),
    plotOptions: { bar: { horizontal: true, barHeight: '55%' } },
    xaxis: {
      categories: rows.map((row) => row.label),
      title: { text: 'Savings, MWh/yr' },
      labels: { formatter: (value: string) => formatNumber(Number(value)) },
    },
    legend: { position: 'bottom' },
    tooltip: { shared: true, intersect: false, y: { formatter: (value: number) => `${formatNumber(value, 1)} MWh/yr` } },
  };
  return { series, options };
}
