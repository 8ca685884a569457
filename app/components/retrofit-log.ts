// Words, colours and small figures shared by the Retrofit log's screens (list, board, detail,
// motor page, Overview). Statuses and transitions come from the shared schema; nothing here decides
// what a role may do (the server answers `allowedTransitions`).
import { OPTIONS } from 'calc/assess/options';
import type { RetrofitStatus } from 'shared/retrofit';
import { formatNumber } from 'src/utils/format';

/** The lifecycle in order; 'rejected' leaves it at the decision. */
export const LIFECYCLE: readonly RetrofitStatus[] = ['proposed', 'approved', 'ordered', 'installed', 'verified'];

export const STATUS_LABELS: Readonly<Record<RetrofitStatus, string>> = {
  proposed: 'Proposed',
  approved: 'Approved',
  ordered: 'Ordered',
  installed: 'Installed',
  verified: 'Verified',
  rejected: 'Rejected',
};

/** Our own status colours (Quasar palette names), the same on the list, the board and the detail. */
export const STATUS_COLOURS: Readonly<Record<RetrofitStatus, string>> = {
  proposed: 'blue-grey-6',
  approved: 'indigo-6',
  ordered: 'amber-9',
  installed: 'teal-7',
  verified: 'green-8',
  rejected: 'grey-6',
};

/** The button that moves a retrofit into a status. */
export const TRANSITION_LABELS: Readonly<Record<RetrofitStatus, string>> = {
  proposed: 'Propose',
  approved: 'Approve',
  rejected: 'Reject',
  ordered: 'Record the order',
  installed: 'Record the installation',
  verified: 'Confirm verified savings',
};

/** What happens next, for people, by status. */
export const NEXT_STEP: Readonly<Record<RetrofitStatus, string>> = {
  proposed: 'Waiting for an approver’s decision',
  approved: 'Order the equipment',
  ordered: 'Install it and record the installation',
  installed: 'Upload meter data before and after, then confirm the savings',
  verified: 'Closed: savings verified',
  rejected: 'Closed: rejected',
};

const OPTION_LABELS = new Map<string, string>(OPTIONS.map((option) => [option.code, option.label]));

/** "New IE4 motor, + speed control" for "ie4-vsd"; the code itself when unknown. */
export function optionLabel(code: string): string {
  return OPTION_LABELS.get(code) ?? code;
}

/** True when the option puts a drive (inverter) on the supply: speed control or a BLDC's own drive. */
export function optionHasDrive(code: string): boolean {
  return code.endsWith('-vsd') || code.startsWith('bldc');
}

/** True when the option fits a permanent-magnet rotor. */
export function optionHasMagnets(code: string): boolean {
  return code.startsWith('bldc');
}

/** Energy per year: "12,300 kWh/yr" below 100 MWh, "123 MWh/yr" above. */
export function formatKwhPerYear(kwh: number | null): string {
  if (kwh === null) return '—';
  return Math.abs(kwh) >= 100_000 ? `${formatNumber(kwh / 1000)} MWh/yr` : `${formatNumber(kwh)} kWh/yr`;
}

/** Energy over a period: whole kWh above 100, one decimal below. */
export function formatKwh(kwh: number | null): string {
  if (kwh === null) return '—';
  return `${formatNumber(kwh, Math.abs(kwh) < 100 ? 1 : 0)} kWh`;
}

/** "2026-03-02T14:00" (wall clock of the meter) → "2026-03-02 14:00". */
export function wallClock(iso: string): string {
  return iso.slice(0, 16).replace('T', ' ');
}

/** A realised share: "92 %" (one decimal below 10 %); null → "—". */
export function formatPct(value: number | null): string {
  return value === null ? '—' : `${formatNumber(value, Math.abs(value) < 10 ? 1 : 0)} %`;
}

/**
 * A colour class for a realised share, judged on the figure as shown (rounded): 85 % or more is as
 * predicted within the usual spread of M&V, below 60 % calls for a look at the installation or the data.
 * Our own bands, no standard sets them.
 */
export function realisedColour(pct: number): string {
  const shown = Math.round(pct);
  return shown >= 85 ? 'text-positive' : shown >= 60 ? 'text-warning' : 'text-negative';
}
