/**
 * Site screening (`POST /api/sites/:id/screening`) as a background job (`GET /api/jobs/:id`), and
 * retrofit proposals made from its rows (`POST /api/screenings/:jobId/proposals`, `GET /api/retrofits`).
 *
 * The job assesses every matching motor of the site with calc's `assess`, keeps each motor's options
 * with a positive NPV, ranks the motors by NPV or payback and, with a `budget`, picks at most one
 * option per motor so that the total capex stays within the budget and the total NPV is highest
 * (a multiple-choice knapsack; see server/screening/knapsack.ts).
 */
import { z } from 'zod';
import { applicationSchema, efficiencyClassSchema } from '../../calc/assess/schema.js';
import { listOf, listQuery } from './common.js';

export const RANK_BY = ['npv', 'payback'] as const;

/** One value or a list (`application: 'fan'` or `['fan', 'pump']`). */
const oneOrMany = <T extends z.ZodType>(item: T) => z.union([item, z.array(item).min(1).max(20)]);

export const screeningFilters = z
  .object({
    area: z.string().trim().min(1).max(80).optional(),
    application: oneOrMany(applicationSchema).optional(),
    efficiencyClass: oneOrMany(efficiencyClassSchema).optional(),
    minKw: z.number().min(0, 'must be zero or more').optional(),
    maxKw: z.number().min(0, 'must be zero or more').optional(),
  })
  .refine((filters) => filters.minKw === undefined || filters.maxKw === undefined || filters.minKw <= filters.maxKw, {
    message: 'must be at least minKw',
    path: ['maxKw'],
  });
export type ScreeningFilters = z.infer<typeof screeningFilters>;

/** `POST /api/sites/:id/screening` → 202 `{ jobId }`. */
export const screeningStartBody = z.object({
  /** Capital budget in the site's currency; left out: every motor's best option is selected. */
  budget: z.number().positive('must be positive').max(1e10, 'must be at most 10 000 000 000').optional(),
  filters: screeningFilters.optional(),
  rankBy: z.enum(RANK_BY, { error: 'must be npv or payback' }).default('npv'),
});
export type ScreeningStart = z.infer<typeof screeningStartBody>;
export const screeningStarted = z.object({ jobId: z.number().int() });

/** An option of one motor that pays (NPV > 0): what the knapsack chooses from. */
export const screeningCandidate = z.object({
  code: z.string(),
  capex: z.number(),
  npv: z.number(),
  simplePaybackYears: z.number().nullable(),
});

/** One motor's row: its chosen option's figures (the knapsack's pick if selected, else its best option). */
export const screeningRow = z.object({
  rank: z.number().int(),
  motorId: z.number().int(),
  tag: z.string(),
  area: z.string().nullable(),
  application: z.string(),
  ratedPowerKw: z.number(),
  /** Option shown; null when no option pays (the motor is kept). */
  optionCode: z.string().nullable(),
  optionLabel: z.string().nullable(),
  /** Option with the highest NPV (calc's recommendation). */
  recommendedCode: z.string(),
  annualKwhSaved: z.number(),
  costSaved: z.number(),
  co2SavedKg: z.number(),
  kvaFreed: z.number(),
  lineCurrentFreedA: z.number(),
  capex: z.number(),
  paybackYears: z.number().nullable(),
  npv: z.number(),
  irr: z.number().nullable(),
  selected: z.boolean(),
  /** True when the linked BLDC design's curve was used for the BLDC options. */
  usesBldcDesign: z.boolean(),
  candidates: z.array(screeningCandidate),
});
export type ScreeningRow = z.infer<typeof screeningRow>;

export const screeningTotals = z.object({
  motors: z.number().int(),
  annualKwhSaved: z.number(),
  costSaved: z.number(),
  co2SavedKg: z.number(),
  kvaFreed: z.number(),
  capex: z.number(),
  npv: z.number(),
});
export type ScreeningTotals = z.infer<typeof screeningTotals>;

export const screeningResult = z.object({
  siteId: z.number().int(),
  siteName: z.string(),
  currency: z.string(),
  budget: z.number().nullable(),
  rankBy: z.enum(RANK_BY),
  filters: z.record(z.string(), z.unknown()),
  motorCount: z.number().int(),
  /** Motors that could not be assessed, with calc's message naming the field. */
  failed: z.array(z.object({ motorId: z.number().int(), tag: z.string(), message: z.string() })),
  rows: z.array(screeningRow),
  /** Totals of the selected rows. */
  totals: screeningTotals,
  selection: z.object({
    method: z.string(),
    /** False only when the exact frontier grew past its bound and states were merged (see method). */
    exact: z.boolean(),
  }),
});
export type ScreeningResult = z.infer<typeof screeningResult>;

export const JOB_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

/** `GET /api/jobs/:id`. `result` is the job kind's result (for `screening`: screeningResult). */
export const jobOutput = z.object({
  id: z.number().int(),
  kind: z.string(),
  status: z.enum(JOB_STATUSES),
  /** 0 to 1. */
  progress: z.number(),
  result: z.unknown().nullable(),
  error: z.string().nullable(),
  params: z.record(z.string(), z.unknown()),
  createdById: z.number().int().nullable(),
  createdAt: z.string(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
});
export type JobOutput = z.infer<typeof jobOutput>;

/** `POST /api/screenings/:jobId/proposals`: rows of a finished screening become retrofit proposals. */
export const proposalParams = z.object({ jobId: z.coerce.number().int().positive() });
export const proposalCreateBody = z.object({
  motorIds: z.array(z.number().int().positive()).min(1, 'needs at least one motor').max(5000),
});

export const RETROFIT_STATUSES = ['proposed', 'approved', 'rejected', 'ordered', 'installed', 'verified'] as const;
/** 'case': created approved by a business-case approval (server/cases, migration 20261201160200). */
export const RETROFIT_SOURCES = ['screening', 'study', 'manual', 'case'] as const;

export const retrofitOutput = z.object({
  id: z.number().int(),
  motorId: z.number().int(),
  motorTag: z.string(),
  siteId: z.number().int(),
  siteName: z.string(),
  optionCode: z.string(),
  status: z.enum(RETROFIT_STATUSES),
  source: z.enum(RETROFIT_SOURCES),
  jobId: z.number().int().nullable(),
  predictedSavingsKwh: z.number(),
  predictedSavingsCost: z.number(),
  capex: z.number(),
  npv: z.number(),
  currency: z.string(),
  createdById: z.number().int().nullable(),
  createdAt: z.string(),
  version: z.number().int(),
});
export type RetrofitOutput = z.infer<typeof retrofitOutput>;
export const proposalsCreated = z.object({ items: z.array(retrofitOutput), created: z.number().int(), alreadyProposed: z.number().int() });

export const RETROFIT_SORT_FIELDS = ['createdAt', 'npv', 'capex'] as const;
export const retrofitListQuery = listQuery(RETROFIT_SORT_FIELDS, '-createdAt').extend({
  status: z.enum(RETROFIT_STATUSES).optional(),
  siteId: z.coerce.number().int().positive().optional(),
  motorId: z.coerce.number().int().positive().optional(),
});
export type RetrofitListQuery = z.infer<typeof retrofitListQuery>;
export const retrofitList = listOf(retrofitOutput);
