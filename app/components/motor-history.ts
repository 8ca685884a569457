// A motor's change history in words: who did what, and each changed field "from → to".
import type { MotorField, MotorHistoryItem } from 'shared/motor';
import { formatNumber } from 'src/utils/format';
import type { Application, ControlMethod, EfficiencyClass, MotorStatus } from './motor-form';
import { APPLICATION_LABELS, CONTROL_LABELS, EFFICIENCY_CLASS_LABELS, MOTOR_FIELD_LABELS, STATUS_LABELS, labelOf } from './motor-labels';

export interface HistoryEntry {
  id: number;
  title: string;
  who: string;
  when: string;
  lines: string[];
}

const ACTION_TITLES: Record<string, string> = {
  create: 'Added to the register',
  update: 'Edited',
  retire: 'Retired',
  restore: 'Back in the register',
  'add-file': 'File attached',
  'add-measurement': 'Measurement recorded',
  'import-create': 'Added by an import',
  'import-update': 'Updated by an import',
  'import-undo-remove': 'Removed: its import was undone',
  'import-undo-restore': 'Restored: an import was undone',
};

const UNITS: Partial<Record<MotorField, string>> = {
  speedRpm: 'rpm',
  voltageV: 'V',
  frequencyHz: 'Hz',
  ratedCurrentA: 'A',
  nameplateEfficiencyPct: '%',
  hoursPerYear: 'h/year',
};

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** One value of a field as the screens show it. */
export function formatFieldValue(field: string, value: unknown, formatPower: (kw: number) => string): string {
  if (value === null || value === undefined || value === '') return '—';
  switch (field) {
    case 'ratedPowerKw':
      return typeof value === 'number' ? formatPower(value) : String(value);
    case 'application':
      return labelOf(APPLICATION_LABELS, value as Application);
    case 'controlMethod':
      return labelOf(CONTROL_LABELS, value as ControlMethod);
    case 'status':
      return labelOf(STATUS_LABELS, value as MotorStatus);
    case 'efficiencyClass':
      return labelOf(EFFICIENCY_CLASS_LABELS, value as EfficiencyClass);
    case 'dutyProfile': {
      if (!Array.isArray(value)) return String(value);
      const hours = value.reduce((sum: number, bin: unknown) => sum + (isRecord(bin) && typeof bin.hours === 'number' ? bin.hours : 0), 0);
      return `${value.length} ${value.length === 1 ? 'bin' : 'bins'}, ${formatNumber(hours)} h`;
    }
    default: {
      if (typeof value === 'number') {
        const unit = UNITS[field as MotorField];
        return unit ? `${formatNumber(value, 3)} ${unit}` : formatNumber(value, 3);
      }
      return String(value);
    }
  }
}

function fieldLabel(field: string): string {
  return (MOTOR_FIELD_LABELS as Record<string, string>)[field] ?? field;
}

/** The lines that describe one history item's changes. */
export function historyLines(item: Pick<MotorHistoryItem, 'action' | 'changes'>, formatPower: (kw: number) => string): string[] {
  const changes = item.changes;
  if (!changes) return [];
  if (item.action === 'add-file') {
    const kind = changes.kind === 'nameplate-photo' ? 'Nameplate photo' : 'Document';
    return [`${kind}: ${String(changes.fileName ?? '')}`];
  }
  if (item.action === 'add-measurement') {
    const parts: string[] = [];
    if (typeof changes.inputPowerKw === 'number') parts.push(`${formatNumber(changes.inputPowerKw, 2)} kW in`);
    if (typeof changes.speedRpm === 'number') parts.push(`${formatNumber(changes.speedRpm)} rpm`);
    if (typeof changes.currentA === 'number') parts.push(`${formatNumber(changes.currentA, 1)} A`);
    if (typeof changes.voltageV === 'number') parts.push(`${formatNumber(changes.voltageV)} V`);
    const day = typeof changes.measuredAt === 'string' ? changes.measuredAt.slice(0, 10) : '';
    return [[day, parts.join(', ')].filter(Boolean).join(': ')];
  }
  if (item.action.startsWith('import-')) {
    const lines = typeof changes.importBatchId === 'number' ? [`Import #${changes.importBatchId}${typeof changes.row === 'number' ? `, row ${changes.row}` : ''}`] : [];
    const nested = isRecord(changes.changes) ? historyLines({ action: 'update', changes: changes.changes }, formatPower) : [];
    return [...lines, ...nested];
  }
  if (item.action === 'create') {
    const tag = typeof changes.tag === 'string' ? changes.tag : null;
    const power = typeof changes.ratedPowerKw === 'number' ? formatPower(changes.ratedPowerKw) : null;
    return [[tag, power].filter(Boolean).join(', ')].filter(Boolean);
  }
  return Object.entries(changes)
    .filter(([field]) => field !== 'version')
    .map(([field, change]) =>
      isRecord(change) && ('from' in change || 'to' in change)
        ? `${fieldLabel(field)}: ${formatFieldValue(field, change.from, formatPower)} → ${formatFieldValue(field, change.to, formatPower)}`
        : `${fieldLabel(field)}: ${formatFieldValue(field, change, formatPower)}`,
    );
}

export function historyTitle(action: string): string {
  return ACTION_TITLES[action] ?? action.charAt(0).toUpperCase() + action.slice(1).replace(/-/g, ' ');
}
