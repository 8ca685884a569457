import { z } from 'zod';
import { caseSummary } from './case.js';

/**
 * Energy and savings figures of the organisation or of one site. Energy today is the sum of the
 * motors' assessed baselines [kWh/yr]; savings [kWh/yr, currency/yr] are cumulative stages of the
 * Retrofit log: approved counts retrofits approved or beyond (ordered, installed, verified),
 * installed counts installed or verified, verified counts verified (predicted savings until metered
 * savings are recorded).
 */
export const overviewFigures = z.object({
  /** Null when the sites use different currencies (money figures then add nothing across them). */
  currency: z.string().nullable(),
  energyTodayKwh: z.number(),
  energyCostToday: z.number(),
  co2TodayKg: z.number(),
  /** Motors calc could not assess (left out of energy today). */
  unassessedMotors: z.number().int(),
  identified: z.object({
    kwh: z.number(),
    cost: z.number(),
    motors: z.number().int(),
    /** 'case': the latest business case of the site; 'assessment': the register assessed now. */
    source: z.enum(['case', 'assessment', 'mixed']),
  }),
  approved: z.object({ kwh: z.number(), cost: z.number(), retrofits: z.number().int() }),
  installed: z.object({ kwh: z.number(), cost: z.number(), retrofits: z.number().int() }),
  verified: z.object({ kwh: z.number(), cost: z.number(), retrofits: z.number().int() }),
});
export type OverviewFigures = z.infer<typeof overviewFigures>;

export const overviewResponse = z.object({
  organization: z.object({ id: z.number().int(), name: z.string() }),
  totals: z.object({ sites: z.number().int(), motors: z.number().int(), installedKw: z.number() }),
  sites: z.array(
    z.object({
      id: z.number().int(),
      name: z.string(),
      motors: z.number().int(),
      installedKw: z.number(),
      /** Added with business cases (issue 8). */
      figures: overviewFigures.optional(),
      latestCaseId: z.number().int().nullable().optional(),
    }),
  ),
  byApplication: z.array(z.object({ application: z.string(), motors: z.number().int(), installedKw: z.number() })),
  /** Organisation totals of energy and savings (issue 8). */
  figures: overviewFigures.optional(),
  /** The five most recent business cases (issue 8). */
  latestCases: z.array(caseSummary).optional(),
});
export type OverviewResponse = z.infer<typeof overviewResponse>;
