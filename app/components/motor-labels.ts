// The words the screens use for a motor's codes and fields (the API keeps its codes).
import type { MotorField } from 'shared/motor';
import type { Application, ControlMethod, EfficiencyClass, MotorStatus } from './motor-form';

export const APPLICATION_LABELS: Record<Application, string> = {
  fan: 'Fan',
  pump: 'Pump',
  compressor: 'Compressor',
  conveyor: 'Conveyor',
  mixer: 'Mixer',
  other: 'Other',
};

export const CONTROL_LABELS: Record<ControlMethod, string> = {
  'direct-on-line': 'Direct on line',
  'throttle-valve': 'Throttling valve',
  'outlet-damper': 'Outlet damper',
  'inlet-vanes': 'Inlet guide vanes',
  'variable-speed-drive': 'Variable-speed drive',
};

export const STATUS_LABELS: Record<MotorStatus, string> = {
  'in-service': 'In service',
  standby: 'Standby',
  'out-of-service': 'Out of service',
  retired: 'Retired',
};

/** Badge colours (Quasar palette names) of a status. */
export const STATUS_COLOURS: Record<MotorStatus, string> = {
  'in-service': 'positive',
  standby: 'info',
  'out-of-service': 'warning',
  retired: 'grey-7',
};

export const EFFICIENCY_CLASS_LABELS: Record<EfficiencyClass, string> = {
  IE1: 'IE1',
  IE2: 'IE2',
  IE3: 'IE3',
  IE4: 'IE4',
  IE5: 'IE5',
  unknown: 'Unknown',
};

/** A field's name as an engineer reads it on a nameplate or a survey sheet. */
export const MOTOR_FIELD_LABELS: Record<MotorField | 'siteId', string> = {
  siteId: 'Site',
  tag: 'Tag',
  description: 'Description',
  area: 'Area / line',
  application: 'Application',
  ratedPowerKw: 'Rated power',
  speedRpm: 'Rated speed',
  poles: 'Poles',
  voltageV: 'Rated voltage',
  frequencyHz: 'Frequency',
  ratedCurrentA: 'Rated current',
  efficiencyClass: 'Efficiency class',
  nameplateEfficiencyPct: 'Nameplate efficiency',
  powerFactor: 'Power factor',
  frame: 'Frame',
  enclosure: 'Enclosure',
  manufacturer: 'Manufacturer',
  yearInstalled: 'Year installed',
  rewinds: 'Rewinds',
  controlMethod: 'Control method',
  hoursPerYear: 'Running hours',
  loadFactor: 'Load factor',
  dutyProfile: 'Duty profile',
  status: 'Status',
  notes: 'Notes',
};

export function labelOf<T extends string>(labels: Record<T, string>, code: T | null | undefined): string {
  return code === null || code === undefined ? '—' : (labels[code] ?? code);
}

/** Options for a QSelect from a label table. */
export function optionsOf<T extends string>(labels: Record<T, string>): { label: string; value: T }[] {
  return (Object.entries(labels) as [T, string][]).map(([value, label]) => ({ value, label }));
}
