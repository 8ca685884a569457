// The Motor form's working copy: what the inputs hold (blank numbers are null) and its conversion to
// and from the API's shapes. Kept apart from the page so it can be tested on its own.
import type { z } from 'zod';
import type { applicationSchema, controlMethodSchema, efficiencyClassSchema, motorStatusSchema, MotorOutput } from 'shared/motor';
import { MOTOR_LIMITS } from 'shared/motor';

export type Application = z.infer<typeof applicationSchema>;
export type ControlMethod = z.infer<typeof controlMethodSchema>;
export type EfficiencyClass = z.infer<typeof efficiencyClassSchema>;
export type MotorStatus = z.infer<typeof motorStatusSchema>;

/** How the motor's yearly use is described: one average load, or hours at several loads. */
export type UsageMode = 'load-factor' | 'duty-profile';

export interface DutyBinDraft {
  /** Stable key for the list (bins have no id). */
  key: number;
  /** Per cent of rated load (or rated flow for a fan or pump); the API takes a fraction. */
  percent: number | null;
  hours: number | null;
}

export interface MotorDraft {
  siteId: number | null;
  tag: string;
  description: string;
  area: string;
  application: Application;
  status: MotorStatus;
  ratedPowerKw: number | null;
  speedRpm: number | null;
  poles: number | null;
  voltageV: number | null;
  frequencyHz: 50 | 60 | null;
  ratedCurrentA: number | null;
  nameplateEfficiencyPct: number | null;
  powerFactor: number | null;
  efficiencyClass: EfficiencyClass;
  frame: string;
  enclosure: string;
  yearInstalled: number | null;
  manufacturer: string;
  controlMethod: ControlMethod;
  rewinds: number | null;
  usage: UsageMode;
  hoursPerYear: number | null;
  loadFactor: number | null;
  dutyProfile: DutyBinDraft[];
  notes: string;
}

export const HOURS_PER_YEAR = MOTOR_LIMITS.maxHoursPerYear;

let binKey = 0;
export function newBinKey(): number {
  binKey += 1;
  return binKey;
}

export function dutyBin(percent: number | null, hours: number | null): DutyBinDraft {
  return { key: newBinKey(), percent, hours };
}

/** A fan's or a pump's duty is read against flow; every other machine's against load. */
export function readsFlow(application: Application): boolean {
  return application === 'fan' || application === 'pump';
}

/** Total hours of a profile [h]; blank hours count as zero. */
export function dutyTotalHours(bins: readonly DutyBinDraft[]): number {
  return bins.reduce((sum, bin) => sum + (bin.hours ?? 0), 0);
}

/** The hours-weighted mean fraction of a profile, or null when it has no hours. */
export function dutyMeanFraction(bins: readonly DutyBinDraft[]): number | null {
  const total = dutyTotalHours(bins);
  if (total <= 0) return null;
  return bins.reduce((sum, bin) => sum + ((bin.percent ?? 0) / 100) * (bin.hours ?? 0), 0) / total;
}

/** A starting profile for the editor: three bins that add up to the running hours (or 6000 h). */
export function starterProfile(hoursPerYear: number | null): DutyBinDraft[] {
  const hours = hoursPerYear && hoursPerYear > 0 ? Math.min(hoursPerYear, HOURS_PER_YEAR) : 6000;
  return [dutyBin(50, Math.round(hours * 0.25)), dutyBin(75, Math.round(hours * 0.5)), dutyBin(100, hours - Math.round(hours * 0.25) - Math.round(hours * 0.5))];
}

/** A new motor starts on its site's supply; the nameplate is for the user to read out. */
export function emptyMotorDraft(site?: { id: number; voltageV: number; frequencyHz: 50 | 60 } | null): MotorDraft {
  return {
    siteId: site?.id ?? null,
    tag: '',
    description: '',
    area: '',
    application: 'other',
    status: 'in-service',
    ratedPowerKw: null,
    speedRpm: null,
    poles: 4,
    voltageV: site?.voltageV ?? null,
    frequencyHz: site?.frequencyHz ?? null,
    ratedCurrentA: null,
    nameplateEfficiencyPct: null,
    powerFactor: null,
    efficiencyClass: 'unknown',
    frame: '',
    enclosure: '',
    yearInstalled: null,
    manufacturer: '',
    controlMethod: 'direct-on-line',
    rewinds: 0,
    usage: 'load-factor',
    hoursPerYear: null,
    loadFactor: null,
    dutyProfile: [],
    notes: '',
  };
}

export function motorToDraft(motor: MotorOutput): MotorDraft {
  const profile = motor.dutyProfile ?? [];
  return {
    siteId: motor.siteId,
    tag: motor.tag,
    description: motor.description ?? '',
    area: motor.area ?? '',
    application: motor.application,
    status: motor.status,
    ratedPowerKw: motor.ratedPowerKw,
    speedRpm: motor.speedRpm,
    poles: motor.poles,
    voltageV: motor.voltageV,
    frequencyHz: motor.frequencyHz === 50 || motor.frequencyHz === 60 ? motor.frequencyHz : null,
    ratedCurrentA: motor.ratedCurrentA,
    nameplateEfficiencyPct: motor.nameplateEfficiencyPct,
    powerFactor: motor.powerFactor,
    efficiencyClass: motor.efficiencyClass,
    frame: motor.frame ?? '',
    enclosure: motor.enclosure ?? '',
    yearInstalled: motor.yearInstalled,
    manufacturer: motor.manufacturer ?? '',
    controlMethod: motor.controlMethod,
    rewinds: motor.rewinds,
    usage: profile.length > 0 ? 'duty-profile' : 'load-factor',
    hoursPerYear: motor.hoursPerYear,
    loadFactor: motor.loadFactor,
    dutyProfile: profile.map((bin) => dutyBin(Math.round(bin.fraction * 1e4) / 100, bin.hours)),
    notes: motor.notes ?? '',
  };
}

const orUndefined = (value: number | null) => (value === null ? undefined : value);
const textOrNull = (value: string) => (value.trim() === '' ? null : value.trim());

/**
 * What the form sends, before validation (with motorCreateBody, the server's own schema): blank
 * required numbers become undefined (so the schema says "is required"), blank optional values null
 * (= not known, which also clears them on an edit). A duty profile replaces the load factor and
 * sets the running hours to its total.
 */
export function draftToInput(draft: MotorDraft): Record<string, unknown> {
  const profile = draft.usage === 'duty-profile';
  return {
    siteId: orUndefined(draft.siteId),
    tag: draft.tag.trim(),
    description: textOrNull(draft.description),
    area: textOrNull(draft.area),
    application: draft.application,
    status: draft.status,
    ratedPowerKw: orUndefined(draft.ratedPowerKw),
    speedRpm: draft.speedRpm,
    poles: orUndefined(draft.poles),
    voltageV: orUndefined(draft.voltageV),
    frequencyHz: orUndefined(draft.frequencyHz),
    ratedCurrentA: draft.ratedCurrentA,
    nameplateEfficiencyPct: draft.nameplateEfficiencyPct,
    powerFactor: draft.powerFactor,
    efficiencyClass: draft.efficiencyClass,
    frame: textOrNull(draft.frame),
    enclosure: textOrNull(draft.enclosure),
    yearInstalled: draft.yearInstalled,
    manufacturer: textOrNull(draft.manufacturer),
    controlMethod: draft.controlMethod,
    rewinds: orUndefined(draft.rewinds),
    hoursPerYear: profile ? dutyTotalHours(draft.dutyProfile) : draft.hoursPerYear,
    loadFactor: profile ? null : draft.loadFactor,
    dutyProfile: profile
      ? draft.dutyProfile.map((bin) => ({
          fraction: bin.percent === null ? undefined : Math.round(bin.percent * 100) / 1e4,
          hours: orUndefined(bin.hours),
        }))
      : null,
    notes: textOrNull(draft.notes),
  };
}
