import { z } from 'zod';
import { currencyCode, listOf, listQuery, versionField } from './common.js';

/** One band of a time-of-use tariff: a price for the share of the running hours it covers. */
export const touBand = z.object({
  name: z.string().trim().min(1, 'is required').max(40),
  pricePerKwh: z.number().min(0, 'must be zero or more').max(10, 'must be at most 10 per kWh'),
  shareOfHoursPct: z.number().min(0).max(100),
});

const siteFields = {
  name: z.string().trim().min(1, 'is required').max(120),
  code: z.string().trim().max(20).optional(),
  location: z.string().trim().max(200).optional(),
  voltageV: z.number().min(100, 'must be at least 100 V').max(15000, 'must be at most 15 kV'),
  frequencyHz: z.union([z.literal(50), z.literal(60)], { error: 'must be 50 or 60' }),
  energyPricePerKwh: z.number().min(0, 'must be zero or more').max(10, 'must be at most 10 per kWh'),
  timeOfUse: z
    .array(touBand)
    .max(6)
    .refine((bands) => bands.length === 0 || Math.abs(bands.reduce((sum, b) => sum + b.shareOfHoursPct, 0) - 100) < 0.01, {
      message: 'shares of hours must add up to 100 %',
    })
    .optional(),
  demandChargePerKwMonth: z.number().min(0, 'must be zero or more').max(1000),
  currency: currencyCode,
  co2KgPerKwh: z.number().min(0, 'must be zero or more').max(2, 'must be at most 2 kg/kWh'),
  defaultHoursPerYear: z.number().int().min(0).max(8760, 'must be at most 8760 h (one year)'),
};

export const siteCreateBody = z.object(siteFields);
export const siteUpdateBody = z
  .object(siteFields)
  .partial()
  .extend({ version: versionField, archived: z.boolean().optional() });

export const siteOutput = z.object({
  id: z.number().int(),
  ...siteFields,
  code: z.string().nullable(),
  location: z.string().nullable(),
  timeOfUse: z.array(touBand),
  archived: z.boolean(),
  motorCount: z.number().int(),
  installedKw: z.number(),
  version: z.number().int(),
  updatedAt: z.string(),
});
export type SiteOutput = z.infer<typeof siteOutput>;
export type SiteCreate = z.infer<typeof siteCreateBody>;

export const SITE_SORT_FIELDS = ['name', 'voltageV', 'updatedAt'] as const;
export const siteListQuery = listQuery(SITE_SORT_FIELDS, 'name').extend({
  q: z.string().trim().max(100).optional(),
  archived: z.enum(['include', 'exclude', 'only']).default('exclude'),
});
export const siteList = listOf(siteOutput);
