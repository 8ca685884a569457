// The record of a retrofit as a flat form (dates, costs, who fitted it, the installed motor's and
// drive's nameplate, notes) and its conversion to the PATCH body the server validates with
// `retrofitPatchBody`, so the same schema checks it in the browser first.
import type { InstalledEquipment, RetrofitDetail, RetrofitFileKind, RetrofitPatch } from 'shared/retrofit';

export interface RetrofitRecordForm {
  orderDate: string;
  expectedInstallationDate: string;
  installationDate: string;
  actualCapex: number | null;
  rebateReceived: number | null;
  installedBy: string;
  motorType: string;
  motorKw: number | null;
  motorEfficiencyPct: number | null;
  motorClass: string;
  motorFrame: string;
  driveType: string;
  driveKw: number | null;
  driveEfficiencyPct: number | null;
  notes: string;
}

/** Labels of the schema's paths, for messages ("Efficiency must be at most 100 %"). */
export const RECORD_LABELS: Record<string, string> = {
  orderDate: 'Order date',
  expectedInstallationDate: 'Installation due',
  installationDate: 'Installation date',
  actualCapex: 'Actual cost',
  rebateReceived: 'Rebate received',
  'installedEquipment.installedBy': 'Installed by',
  'installedEquipment.motor.type': 'Motor type',
  'installedEquipment.motor.ratedPowerKw': 'Motor rated power',
  'installedEquipment.motor.efficiencyPct': 'Motor efficiency',
  'installedEquipment.motor.efficiencyClass': 'Efficiency class',
  'installedEquipment.motor.frame': 'Frame',
  'installedEquipment.drive.type': 'Drive type',
  'installedEquipment.drive.ratedPowerKw': 'Drive rating',
  'installedEquipment.drive.efficiencyPct': 'Drive efficiency',
  notes: 'Notes',
  comment: 'Comment',
};

export function emptyRecordForm(): RetrofitRecordForm {
  return {
    orderDate: '',
    expectedInstallationDate: '',
    installationDate: '',
    actualCapex: null,
    rebateReceived: null,
    installedBy: '',
    motorType: '',
    motorKw: null,
    motorEfficiencyPct: null,
    motorClass: '',
    motorFrame: '',
    driveType: '',
    driveKw: null,
    driveEfficiencyPct: null,
    notes: '',
  };
}

export function recordFormFrom(detail: RetrofitDetail): RetrofitRecordForm {
  const equipment = detail.installedEquipment;
  return {
    orderDate: detail.orderDate ?? '',
    expectedInstallationDate: detail.expectedInstallationDate ?? '',
    installationDate: detail.installationDate ?? '',
    actualCapex: detail.actualCapex,
    rebateReceived: detail.rebateReceived,
    installedBy: equipment?.installedBy ?? '',
    motorType: equipment?.motor?.type ?? '',
    motorKw: equipment?.motor?.ratedPowerKw ?? null,
    motorEfficiencyPct: equipment?.motor?.efficiencyPct ?? null,
    motorClass: equipment?.motor?.efficiencyClass ?? '',
    motorFrame: equipment?.motor?.frame ?? '',
    driveType: equipment?.drive?.type ?? '',
    driveKw: equipment?.drive?.ratedPowerKw ?? null,
    driveEfficiencyPct: equipment?.drive?.efficiencyPct ?? null,
    notes: detail.notes ?? '',
  };
}

/** Only the filled-in entries of an object; undefined when none is. */
function filled<T extends Record<string, unknown>>(value: T): Partial<T> | undefined {
  const entries = Object.entries(value).filter(([, field]) => field !== null && field !== undefined && field !== '');
  return entries.length === 0 ? undefined : (Object.fromEntries(entries) as Partial<T>);
}

/** The installed equipment of the form; null when nothing is filled in. */
export function equipmentFrom(form: RetrofitRecordForm): InstalledEquipment | null {
  const motor = filled({ type: form.motorType.trim(), ratedPowerKw: form.motorKw, efficiencyPct: form.motorEfficiencyPct, efficiencyClass: form.motorClass.trim(), frame: form.motorFrame.trim() });
  const drive = filled({ type: form.driveType.trim(), ratedPowerKw: form.driveKw, efficiencyPct: form.driveEfficiencyPct });
  const installedBy = form.installedBy.trim();
  const equipment: InstalledEquipment = {
    ...(installedBy ? { installedBy } : {}),
    ...(motor ? { motor } : {}),
    ...(drive ? { drive } : {}),
  } as InstalledEquipment;
  return Object.keys(equipment).length === 0 ? null : equipment;
}

export type RecordSection = 'order' | 'installation' | 'notes';

/** The data fields of a PATCH for the sections of the form being saved (blank fields clear their value). */
export function recordBody(form: RetrofitRecordForm, sections: readonly RecordSection[]): Partial<RetrofitPatch> {
  const body: Partial<RetrofitPatch> = {};
  if (sections.includes('order')) {
    body.orderDate = form.orderDate || null;
    body.expectedInstallationDate = form.expectedInstallationDate || null;
    body.actualCapex = form.actualCapex;
    body.rebateReceived = form.rebateReceived;
  }
  if (sections.includes('installation')) {
    body.installationDate = form.installationDate || null;
    body.installedEquipment = equipmentFrom(form);
  }
  if (sections.includes('notes')) body.notes = form.notes.trim() || null;
  return body;
}

/** Today as YYYY-MM-DD in the browser's zone (the plant's day). */
export function todayIso(now = new Date()): string {
  const pad = (value: number) => String(value).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

/** What a transition dialog hands the page: the PATCH body (without the version) and files to attach after it. */
export interface TransitionSubmit {
  body: Omit<RetrofitPatch, 'version'>;
  files: Array<{ file: File; kind: RetrofitFileKind }>;
}

/** How a save of the record editor ended: saved, refused, or met a newer version (409). */
export type SaveOutcome = 'saved' | 'failed' | 'stale';
