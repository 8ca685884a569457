// Retrofit log answers as the server gives them (shapes of server/shared/retrofit.ts), invented figures.
import type { MeterDataOutput, RetrofitDetail, RetrofitLogItem, VerificationOutput, VerificationSummary } from 'shared/retrofit';

export function logItem(overrides: Partial<RetrofitLogItem> = {}): RetrofitLogItem {
  return {
    id: 12,
    motorId: 5,
    motorTag: 'W-P-101',
    siteId: 3,
    siteName: 'Kestrel Valley Wastewater Works',
    optionCode: 'ie4',
    status: 'ordered',
    source: 'manual',
    jobId: null,
    predictedSavingsKwh: 10_000,
    predictedSavingsCost: 1500,
    capex: 4000,
    npv: 9000,
    currency: 'EUR',
    createdById: 7,
    createdAt: '2026-10-01T08:00:00.000Z',
    version: 3,
    orderDate: '2026-10-20',
    expectedInstallationDate: '2026-11-10',
    installationDate: null,
    actualCapex: null,
    rebateReceived: null,
    statusChangedAt: '2026-10-20T09:00:00.000Z',
    overdue: false,
    overdueReason: null,
    verificationMethod: 'B',
    verifiedSavingsKwh: null,
    verifiedUncertaintyKwh: null,
    ...overrides,
  };
}

export function detail(overrides: Partial<RetrofitDetail> = {}): RetrofitDetail {
  return {
    ...logItem(),
    installedEquipment: null,
    notes: null,
    independentVariable: null,
    stipulatedHoursPerYear: null,
    createdByName: 'Emeka Lindqvist',
    motor: { id: 5, tag: 'W-P-101', description: 'Lift pump', ratedPowerKw: 18.5, efficiencyClass: 'IE1', frame: '160L', hoursPerYear: 7870, application: 'pump' },
    allowedTransitions: ['installed'],
    events: [
      { id: 1, fromStatus: null, toStatus: 'proposed', userId: 7, userName: 'Emeka Lindqvist', comment: 'Runs throttled most of the year.', createdAt: '2026-10-01T08:00:00.000Z' },
      { id: 2, fromStatus: 'proposed', toStatus: 'approved', userId: 8, userName: 'Priya Holloway', comment: 'Go ahead.', createdAt: '2026-10-05T10:00:00.000Z' },
      { id: 3, fromStatus: 'approved', toStatus: 'ordered', userId: 7, userName: 'Emeka Lindqvist', comment: null, createdAt: '2026-10-20T09:00:00.000Z' },
    ],
    files: [],
    ...overrides,
  };
}

export const noMeterData: MeterDataOutput = { baseline: null, reporting: null };

export const meterData: MeterDataOutput = {
  baseline: {
    period: 'baseline',
    rows: 336,
    gaps: [{ start: '2026-10-07T05:00:00', end: '2026-10-07T09:00:00', hours: 4, afterRow: 55 }],
    unit: 'kW',
    register: 'interval',
    scope: 'motor',
    intervalMinutes: 60,
    variableName: 'Production [t]',
    utcOffset: null,
    start: '2026-10-05T00:00:00',
    end: '2026-10-19T00:00:00',
    totalKwh: 4173.2,
    fileName: 'pump-before.csv',
    uploadedAt: '2026-10-21T08:00:00.000Z',
    coveredHours: 332,
    series: [
      [1_791_158_400_000, 14.8],
      [1_791_162_000_000, null],
    ],
  },
  reporting: null,
};

export function verification(overrides: Partial<VerificationOutput> = {}): VerificationOutput {
  return {
    retrofitId: 12,
    ready: true,
    missing: [],
    method: 'B',
    model: 'regression',
    description: 'IPMVP option B, retrofit isolation with all parameters measured.',
    formula: 'adjusted baseline = a × (reporting covered hours / 24) + b × X_reporting',
    independentVariable: 'operating hours',
    thresholdKw: 0.925,
    hoursPerYear: 7870,
    baseline: { start: '2026-10-05T00:00:00', end: '2026-10-19T00:00:00', kwh: 4173.2, coveredHours: 336, operatingHours: 281, meanRunningKw: 14.81, variableTotal: null, scope: 'motor', gaps: 0 },
    reporting: { start: '2026-11-16T00:00:00', end: '2026-11-30T00:00:00', kwh: 4039.1, coveredHours: 336, operatingHours: 284, meanRunningKw: 14.19, variableTotal: null, scope: 'motor', gaps: 0 },
    baselineKwh: 4173.2,
    reportingKwh: 4039.1,
    adjustedBaselineKwh: 4217.3,
    reportingComparedKwh: 4039.1,
    verifiedSavingsKwh: 178.2,
    annualSavingsKwh: 9200,
    predictedSavingsKwh: 10_000,
    realisedPct: 92,
    regression: { intercept: 1.2, slope: 14.8, r2: 0.999, cvRmsePct: 0.3, days: 14 },
    uncertaintyKwh: 420,
    uncertaintyPeriodKwh: 8.1,
    confidencePct: 90,
    uncertaintyMethod: 'ASHRAE Guideline 14-2014 Annex B fractional savings uncertainty',
    notes: [],
    ...overrides,
  };
}

export const notReady = verification({
  ready: false,
  missing: ['reporting meter data'],
  model: null,
  baselineKwh: null,
  reportingKwh: null,
  adjustedBaselineKwh: null,
  reportingComparedKwh: null,
  verifiedSavingsKwh: null,
  annualSavingsKwh: null,
  realisedPct: null,
  regression: null,
  uncertaintyKwh: null,
  uncertaintyPeriodKwh: null,
  uncertaintyMethod: null,
  reporting: null,
});

const figures = (retrofits: number, verifiable: number, predictedOfVerifiedKwh: number, verifiedSavingsKwh: number) => ({
  retrofits,
  verifiable,
  predictedSavingsKwh: predictedOfVerifiedKwh,
  verifiedSavingsKwh,
  predictedOfVerifiedKwh,
  realisedPct: verifiable > 0 ? Math.round((verifiedSavingsKwh / predictedOfVerifiedKwh) * 10000) / 100 : null,
  uncertaintyKwh: verifiable > 0 ? 420 : null,
});

export const summary: VerificationSummary = {
  sites: [
    { siteId: 1, siteName: 'Kestrel Valley Cold Store', ...figures(0, 0, 0, 0) },
    { siteId: 3, siteName: 'Kestrel Valley Wastewater Works', ...figures(2, 1, 10_000, 9200) },
  ],
  organization: figures(2, 1, 10_000, 9200),
};

export const emptySummary: VerificationSummary = { sites: [{ siteId: 1, siteName: 'Kestrel Valley Cold Store', ...figures(0, 0, 0, 0) }], organization: figures(0, 0, 0, 0) };

export const sitesList = {
  items: [
    { id: 1, name: 'Kestrel Valley Cold Store' },
    { id: 3, name: 'Kestrel Valley Wastewater Works' },
  ],
  total: 2,
  page: 1,
  pageSize: 500,
};
