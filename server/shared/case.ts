/**
 * Business cases (`/api/cases`): an immutable snapshot of the assessment of a site's motors, or of
 * the whole organisation's, with the recommended retrofits, the case's aggregate economics, the
 * sensitivity of its payback, the assumptions and the cautions. Exported as .xlsx and PDF, e-mailed to
 * the approvers, approved or rejected.
 *
 * Units: energy kWh/yr, money in the case's currency (cents), CO2 kg/yr, current A, apparent power kVA,
 * rates %/yr, times years. Money totals are added in decimal.js (calc's `sumMoney`).
 */
import { z } from 'zod';
import { listOf, listQuery } from './common.js';

export const CASE_SCOPES = ['site', 'all'] as const;
export type CaseScope = (typeof CASE_SCOPES)[number];

/** draft (generated) → sent (e-mailed at least once) → approved | rejected (by an approver). */
export const CASE_STATUSES = ['draft', 'sent', 'approved', 'rejected'] as const;
export type CaseStatus = (typeof CASE_STATUSES)[number];

export const CASE_DECISIONS = ['approved', 'rejected'] as const;
export type CaseDecision = (typeof CASE_DECISIONS)[number];

/** Changes of energy price and operating hours the sensitivity applies [%]. */
export const SENSITIVITY_STEPS_PCT = [-20, -10, 10, 20] as const;
export const SENSITIVITY_FACTORS = ['energyPrice', 'operatingHours'] as const;
export type SensitivityFactor = (typeof SENSITIVITY_FACTORS)[number];

export const EXPORT_FORMATS = ['xlsx', 'pdf'] as const;

/** `POST /api/cases`: `{ siteId }` for one site, or `{ all: true }` for the whole organisation. */
export const caseCreateBody = z
  .object({
    siteId: z.number().int().positive().optional(),
    all: z.literal(true, { error: 'must be true (or left out)' }).optional(),
  })
  .superRefine((body, context) => {
    if (body.siteId === undefined && body.all === undefined) context.addIssue({ code: 'custom', path: ['siteId'], message: 'is required unless all is true' });
    if (body.siteId !== undefined && body.all !== undefined) context.addIssue({ code: 'custom', path: ['all'], message: 'must be left out when siteId is given' });
  });
export type CaseCreate = z.infer<typeof caseCreateBody>;

/** `POST /api/cases/:id/send`: extra addresses besides the organisation's approvers. */
export const caseSendBody = z.object({
  to: z.array(z.email({ error: 'must be an e-mail address' })).max(20, 'has at most 20 addresses').optional(),
  /** A line for the e-mail body. */
  message: z.string().trim().max(2000, 'must be at most 2000 characters').optional(),
});
export type CaseSend = z.infer<typeof caseSendBody>;

/** `POST /api/cases/:id/decision`; a rejection needs a comment saying why. */
export const caseDecisionBody = z
  .object({
    decision: z.enum(CASE_DECISIONS, { error: 'must be approved or rejected' }),
    comment: z.string().trim().max(2000, 'must be at most 2000 characters').default(''),
  })
  .refine((body) => body.decision !== 'rejected' || body.comment.length > 0, { path: ['comment'], message: 'is required to reject' });
export type CaseDecisionInput = z.infer<typeof caseDecisionBody>;

export const caseExportQuery = z.object({ format: z.enum(EXPORT_FORMATS, { error: 'must be xlsx or pdf' }) });

export const CASE_SORT_FIELDS = ['createdAt', 'version', 'status'] as const;
export const caseListQuery = listQuery(CASE_SORT_FIELDS, '-createdAt').extend({
  scope: z.enum(CASE_SCOPES).optional(),
  siteId: z.coerce.number().int().positive().optional(),
  status: z.enum(CASE_STATUSES).optional(),
});
export type CaseListQuery = z.infer<typeof caseListQuery>;

/** One motor of the case: today's figures and those of its recommended option ('keep': no retrofit, zero savings). */
export const caseItem = z.object({
  motorId: z.number().int(),
  tag: z.string(),
  description: z.string().nullable(),
  siteId: z.number().int(),
  siteName: z.string(),
  area: z.string().nullable(),
  application: z.string(),
  ratedPowerKw: z.number(),
  /** calc's recommended option (highest positive NPV), 'keep' when none pays. */
  optionCode: z.string(),
  optionLabel: z.string(),
  reason: z.string(),
  /** True when the linked BLDC design's curve was used for the BLDC options. */
  usesBldcDesign: z.boolean(),
  /** [kWh/yr] */
  baselineKwh: z.number(),
  afterKwh: z.number(),
  savingsKwh: z.number(),
  /** Energy + demand cost [currency/yr]. */
  baselineCost: z.number(),
  afterCost: z.number(),
  savingsCost: z.number(),
  /** [kg/yr] */
  co2SavedKg: z.number(),
  /** Line current at the bin of highest current [A], today / after / freed. */
  lineCurrentBeforeA: z.number(),
  lineCurrentAfterA: z.number(),
  lineCurrentFreedA: z.number(),
  /** [kVA] */
  kvaBefore: z.number(),
  kvaAfter: z.number(),
  kvaFreed: z.number(),
  /** Before rebates [currency]. */
  grossCapex: z.number(),
  rebates: z.number(),
  /** Net of rebates [currency]. */
  capex: z.number(),
  lifeYears: z.number().int(),
  simplePaybackYears: z.number().nullable(),
  discountedPaybackYears: z.number().nullable(),
  npv: z.number(),
  /** [-] (0.25 = 25 %/yr). */
  irr: z.number().nullable(),
  /** Capex + present value of the option's running cost over its life [currency]. */
  lifeCycleCost: z.number(),
});
export type CaseItem = z.infer<typeof caseItem>;

/** Economics of the case as one investment: the year-by-year sum of the recommended items' cash flows. */
export const caseEconomics = z.object({
  grossCapex: z.number(),
  rebates: z.number(),
  capex: z.number(),
  /** First-year savings [currency/yr]. */
  savingsCost: z.number(),
  simplePaybackYears: z.number().nullable(),
  discountedPaybackYears: z.number().nullable(),
  npv: z.number(),
  irr: z.number().nullable(),
  /** Σ over the recommended items: capex + present value of the option's running cost over its life [currency]. */
  lifeCycleCost: z.number(),
  /** The same motors kept as they are: present value of today's running cost over the same lives, no capex [currency]. */
  lifeCycleCostToday: z.number(),
  /** Longest life of the recommended options: the length of the aggregate cash flow [yr]. */
  analysisYears: z.number().int(),
  discountRatePct: z.number(),
  energyEscalationPct: z.number(),
});
export type CaseEconomics = z.infer<typeof caseEconomics>;

export const caseTotals = caseEconomics.extend({
  currency: z.string(),
  motors: z.number().int(),
  /** Motors whose recommendation is not 'keep'. */
  recommendedMotors: z.number().int(),
  /** Motors calc could not assess (listed in `failed`). */
  failedMotors: z.number().int(),
  installedKw: z.number(),
  baselineKwh: z.number(),
  afterKwh: z.number(),
  savingsKwh: z.number(),
  savingsPct: z.number(),
  baselineCost: z.number(),
  co2SavedKg: z.number(),
  lineCurrentFreedA: z.number(),
  kvaFreed: z.number(),
});
export type CaseTotals = z.infer<typeof caseTotals>;

/** Figures of a group of motors: a site, or an area (feeder) of a site. */
export const caseGroup = z.object({
  siteId: z.number().int(),
  siteName: z.string(),
  /** Null for the site row; the area (feeder) name, or '' for motors without an area. */
  area: z.string().nullable(),
  motors: z.number().int(),
  recommendedMotors: z.number().int(),
  installedKw: z.number(),
  baselineKwh: z.number(),
  afterKwh: z.number(),
  savingsKwh: z.number(),
  baselineCost: z.number(),
  savingsCost: z.number(),
  co2SavedKg: z.number(),
  lineCurrentFreedA: z.number(),
  kvaFreed: z.number(),
  grossCapex: z.number(),
  rebates: z.number(),
  capex: z.number(),
  npv: z.number(),
  simplePaybackYears: z.number().nullable(),
});
export type CaseGroup = z.infer<typeof caseGroup>;

/** A bar of a savings chart (by site, application or option). */
export const caseBar = z.object({
  key: z.string(),
  label: z.string(),
  motors: z.number().int(),
  savingsKwh: z.number(),
  savingsCost: z.number(),
  capex: z.number(),
});
export type CaseBar = z.infer<typeof caseBar>;

/** Year t of the aggregate cash flow (t = 0: the investment). */
export const caseCashFlowYear = z.object({
  year: z.number().int(),
  cashFlow: z.number(),
  cumulative: z.number(),
  discountedCumulative: z.number(),
});
export type CaseCashFlowYear = z.infer<typeof caseCashFlowYear>;

export const caseCharts = z.object({
  savingsBySite: z.array(caseBar),
  savingsByApplication: z.array(caseBar),
  savingsByOption: z.array(caseBar),
  cashFlow: z.array(caseCashFlowYear),
  energyBySite: z.array(z.object({ siteId: z.number().int(), label: z.string(), baselineKwh: z.number(), afterKwh: z.number() })),
});
export type CaseCharts = z.infer<typeof caseCharts>;

export const sensitivityPoint = z.object({
  changePct: z.number(),
  savingsCost: z.number(),
  simplePaybackYears: z.number().nullable(),
  discountedPaybackYears: z.number().nullable(),
  npv: z.number(),
  irr: z.number().nullable(),
});
export type SensitivityPoint = z.infer<typeof sensitivityPoint>;

/**
 * Each factor changed alone, the recommended list held fixed, every motor re-assessed with the scaled
 * input; `low`/`high` are the extreme steps (the bars of a tornado chart).
 */
export const caseSensitivity = z.object({
  stepsPct: z.array(z.number()),
  base: sensitivityPoint,
  factors: z.array(
    z.object({
      factor: z.enum(SENSITIVITY_FACTORS),
      label: z.string(),
      points: z.array(sensitivityPoint),
      low: sensitivityPoint,
      high: sensitivityPoint,
    }),
  ),
});
export type CaseSensitivity = z.infer<typeof caseSensitivity>;

/** One assumption behind the case, merged over the motors that used it. */
export const caseAssumption = z.object({
  what: z.string(),
  value: z.union([z.string(), z.number()]),
  source: z.string(),
  /** Motors whose assessment used it. */
  motors: z.number().int(),
});
export type CaseAssumption = z.infer<typeof caseAssumption>;

export const caseFailure = z.object({ motorId: z.number().int(), tag: z.string(), siteName: z.string(), message: z.string() });

/** The computed part of the snapshot (stored as JSONB, never recomputed). */
export const caseResults = z.object({
  totals: caseTotals,
  /** Every assessed motor, by site then tag; the recommended list is those with optionCode ≠ 'keep'. */
  items: z.array(caseItem),
  perSite: z.array(caseGroup),
  perArea: z.array(caseGroup),
  charts: caseCharts,
  sensitivity: caseSensitivity,
  assumptions: z.array(caseAssumption),
  /** Where the case's inputs came from (register, sites, Settings, designs). */
  sources: z.array(z.string()),
  cautions: z.array(z.string()),
  failed: z.array(caseFailure),
});
export type CaseResults = z.infer<typeof caseResults>;

export const casePerson = z.object({ id: z.number().int(), name: z.string(), email: z.string() }).nullable();

/** One e-mailing of the case. */
export const caseSendOutput = z.object({
  id: z.number().int(),
  sentAt: z.string(),
  sentBy: casePerson,
  to: z.array(z.string()),
  messageId: z.string().nullable(),
});
export type CaseSendOutput = z.infer<typeof caseSendOutput>;

/** What `GET /api/cases` lists: who, when, status and headline figures. */
export const caseSummary = z.object({
  id: z.number().int(),
  scope: z.enum(CASE_SCOPES),
  siteId: z.number().int().nullable(),
  /** The site's name, or the organisation's for scope 'all'. */
  title: z.string(),
  /** Per scope (per site, or organisation-wide): 1, 2, 3… */
  version: z.number().int(),
  status: z.enum(CASE_STATUSES),
  currency: z.string(),
  createdBy: casePerson,
  createdAt: z.string(),
  decidedBy: casePerson,
  decidedAt: z.string().nullable(),
  decisionComment: z.string().nullable(),
  lastSentAt: z.string().nullable(),
  headline: z.object({
    motors: z.number().int(),
    recommendedMotors: z.number().int(),
    savingsKwh: z.number(),
    savingsCost: z.number(),
    co2SavedKg: z.number(),
    capex: z.number(),
    npv: z.number(),
    simplePaybackYears: z.number().nullable(),
    irr: z.number().nullable(),
  }),
});
export type CaseSummary = z.infer<typeof caseSummary>;

/** `GET /api/cases/:id` and `POST /api/cases`: the snapshot (inputs are stored but not sent; `basis` says what they were). */
export const caseOutput = caseSummary.extend({
  results: caseResults,
  basis: z.object({
    sites: z.array(z.object({ id: z.number().int(), name: z.string(), currency: z.string(), energyPricePerKwh: z.number(), co2KgPerKwh: z.number(), defaultHoursPerYear: z.number() })),
    motorCount: z.number().int(),
    priceBook: z.enum(['organisation', 'calc defaults']),
    assumptions: z.enum(['organisation', 'calc defaults']),
  }),
  sends: z.array(caseSendOutput),
});
export type CaseOutput = z.infer<typeof caseOutput>;

export const caseList = listOf(caseSummary);
export type CaseList = z.infer<typeof caseList>;

export const caseSent = z.object({ case: caseSummary, send: caseSendOutput });
export type CaseSent = z.infer<typeof caseSent>;

/** The decision's effect on the Retrofit log. */
export const caseDecided = z.object({
  case: caseSummary,
  retrofits: z.object({ created: z.number().int(), approved: z.number().int(), rejected: z.number().int() }),
});
export type CaseDecided = z.infer<typeof caseDecided>;
