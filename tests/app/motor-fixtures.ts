// Motors, sites and import batches as the API answers them, for the register, form, detail and
// intake component tests.
import type { ImportDetail } from 'shared/intake';
import type { MotorOutput } from 'shared/motor';
import type { SiteOutput } from 'shared/site';

export const dairySite: SiteOutput = {
  id: 1,
  name: 'Kestrel Valley Dairy',
  code: 'KVD',
  location: null,
  voltageV: 400,
  frequencyHz: 50,
  energyPricePerKwh: 0.16,
  timeOfUse: [],
  demandChargePerKwMonth: 9,
  currency: 'EUR',
  co2KgPerKwh: 0.3,
  defaultHoursPerYear: 6000,
  archived: false,
  motorCount: 60,
  installedKw: 900,
  version: 1,
  updatedAt: '2026-01-10T08:00:00.000Z',
};

export function motor(overrides: Partial<MotorOutput> = {}): MotorOutput {
  return {
    id: 11,
    siteId: 1,
    siteName: 'Kestrel Valley Dairy',
    tag: 'D-P-101',
    description: 'Raw milk pump',
    area: 'Reception',
    application: 'pump',
    ratedPowerKw: 7.457,
    speedRpm: 1460,
    poles: 4,
    voltageV: 400,
    frequencyHz: 50,
    ratedCurrentA: 14.2,
    efficiencyClass: 'IE2',
    nameplateEfficiencyPct: 88.7,
    powerFactor: 0.82,
    frame: '132M',
    enclosure: 'IP55',
    manufacturer: 'Example Motors',
    yearInstalled: 2008,
    rewinds: 1,
    controlMethod: 'throttle-valve',
    hoursPerYear: 6000,
    loadFactor: 0.7,
    dutyProfile: null,
    status: 'in-service',
    notes: null,
    importBatchId: null,
    version: 4,
    createdAt: '2026-01-10T08:00:00.000Z',
    updatedAt: '2026-01-12T08:00:00.000Z',
    ...overrides,
  };
}

export const emptyList = { items: [], total: 0, page: 1, pageSize: 25 };
export const sitesList = { items: [dairySite], total: 1, page: 1, pageSize: 500 };

export function importDetail(overrides: Partial<ImportDetail> = {}): ImportDetail {
  return {
    id: 5,
    siteId: 1,
    siteName: 'Kestrel Valley Dairy',
    fileName: 'walk-down.xlsx',
    fileSizeBytes: 18000,
    status: 'previewed',
    progress: 0,
    userId: 7,
    userName: 'Demo engineer',
    rows: { total: 3, valid: 2, invalid: 1, warnings: 1 },
    createdCount: 0,
    updatedCount: 0,
    failure: null,
    createdAt: '2026-02-01T09:00:00.000Z',
    committedAt: null,
    undoneAt: null,
    headers: ['Motor tag', 'Power', 'Speed', 'Remarks'],
    headerRow: 2,
    sheetName: 'Survey',
    mapping: { 'Motor tag': 'tag', Power: 'ratedPowerKw', Speed: 'speedRpm', Remarks: null },
    unmappedRequired: [],
    errors: [{ row: 5, field: 'ratedPowerKw', value: 'lots', message: 'is not a number' }],
    warnings: [{ row: 3, field: 'poles', value: null, message: 'worked out as 4 from 1460 rpm at 50 Hz' }],
    duplicates: { inFile: [], inRegister: [{ tag: 'D-P-101', row: 4, motorId: 11 }] },
    preview: {
      items: [
        {
          row: 3,
          action: 'create',
          motorId: null,
          values: { tag: 'SV-1', ratedPowerKw: 7.5 },
          cells: { 'Motor tag': 'SV-1', Power: '7.5 kW', Speed: '1460 rpm', Remarks: 'noisy bearing' },
          errors: [],
          warnings: [{ row: 3, field: 'poles', value: null, message: 'worked out as 4 from 1460 rpm at 50 Hz' }],
        },
        {
          row: 4,
          action: 'update',
          motorId: 11,
          values: { tag: 'D-P-101', ratedPowerKw: 7.457 },
          cells: { 'Motor tag': 'D-P-101', Power: '10 hp', Speed: 1450, Remarks: null },
          errors: [],
          warnings: [],
        },
        {
          row: 5,
          action: 'skip',
          motorId: null,
          values: { tag: 'SV-3' },
          cells: { 'Motor tag': 'SV-3', Power: 'lots', Speed: 2900, Remarks: null },
          errors: [{ row: 5, field: 'ratedPowerKw', value: 'lots', message: 'is not a number' }],
          warnings: [],
        },
      ],
      total: 3,
      page: 1,
      pageSize: 25,
    },
    ...overrides,
  };
}
