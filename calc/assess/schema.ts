/**
 * zod schemas of the assessment's inputs, in DESIGN.md's vocabulary of a motor and a site. The
 * server validates requests with the same schemas; `assess` itself takes the parsed, typed values.
 * The schemas validate only: they fill no defaults, so a value is defaulted in one place (assess) and
 * listed among the assumptions.
 */
import { z } from 'zod';
import { CONTROL_METHODS } from '../loads/fans-pumps.js';
import { MAX_HOURS_PER_YEAR } from './defaults.js';

const positive = (max?: number) => {
  const base = z.number({ error: 'must be a number' }).positive({ error: 'must be positive' });
  return max === undefined ? base : base.max(max, { error: `must be at most ${max}` });
};
const nonNegative = (max?: number) => {
  const base = z.number({ error: 'must be a number' }).min(0, { error: 'must be zero or more' });
  return max === undefined ? base : base.max(max, { error: `must be at most ${max}` });
};

export const efficiencyClassSchema = z.enum(['IE1', 'IE2', 'IE3', 'IE4', 'IE5', 'unknown'], {
  error: 'must be one of IE1, IE2, IE3, IE4, IE5, unknown',
});
export const applicationSchema = z.enum(['fan', 'pump', 'compressor', 'conveyor', 'mixer', 'other'], {
  error: 'must be one of fan, pump, compressor, conveyor, mixer, other',
});
export const controlMethodSchema = z.enum(['direct-on-line', 'throttle-valve', 'outlet-damper', 'inlet-vanes', 'variable-speed-drive'], {
  error: `must be one of ${CONTROL_METHODS.join(', ')}`,
});
export const polesSchema = z.union([z.literal(2), z.literal(4), z.literal(6), z.literal(8)], { error: 'must be 2, 4, 6 or 8' });
export const frequencySchema = z.union([z.literal(50), z.literal(60)], { error: 'must be 50 or 60' });
export const driveClassSchema = z.enum(['IE0', 'IE1', 'IE2'], { error: 'must be IE0, IE1 or IE2' });

/** One bin of a duty profile: a fraction of rated load (of rated flow for a fan or pump) and its hours. */
export const dutyBinSchema = z.object({
  fraction: nonNegative(1.25),
  hours: nonNegative(MAX_HOURS_PER_YEAR),
});

/** A part-load curve (calc/contracts.ts PartLoadCurve) that replaces the generic BLDC model. */
export const partLoadCurveSchema = z.object({
  source: z.string().min(1, { error: 'must not be empty' }),
  ratedPowerKw: positive(),
  points: z
    .array(
      z.object({
        loadFraction: nonNegative(1.25),
        efficiency: positive(0.999),
        powerFactor: positive(1),
      }),
    )
    .min(2, { error: 'needs at least two points' })
    .refine((points) => points.every((point, index) => index === 0 || point.loadFraction > points[index - 1]!.loadFraction), {
      error: 'must be sorted by loadFraction, strictly increasing',
    }),
});

export const motorSchema = z
  .object({
    tag: z.string().optional(),
    description: z.string().optional(),
    area: z.string().optional(),
    application: applicationSchema.optional(),
    ratedPowerKw: positive().min(0.12, { error: 'must be between 0.12 and 1000' }).max(1000, { error: 'must be between 0.12 and 1000' }),
    speedRpm: positive(4000).optional(),
    poles: polesSchema.optional(),
    voltageV: positive(15000).optional(),
    frequencyHz: frequencySchema.optional(),
    ratedCurrentA: positive().optional(),
    efficiencyClass: efficiencyClassSchema.optional(),
    nameplateEfficiencyPct: positive(99.9).optional(),
    powerFactor: positive(1).optional(),
    frame: z.string().optional(),
    controlMethod: controlMethodSchema.optional(),
    hoursPerYear: nonNegative(MAX_HOURS_PER_YEAR).optional(),
    loadFactor: nonNegative(1.25).optional(),
    dutyProfile: z
      .array(dutyBinSchema)
      .min(1, { error: 'needs at least one bin' })
      .max(48, { error: 'has at most 48 bins' })
      .refine((bins) => bins.reduce((sum, bin) => sum + bin.hours, 0) <= MAX_HOURS_PER_YEAR, {
        error: `hours must add up to ${MAX_HOURS_PER_YEAR} or less`,
      })
      .optional(),
    rewinds: z.number().int({ error: 'must be a whole number' }).min(0, { error: 'must be zero or more' }).max(10, { error: 'must be at most 10' }).optional(),
    yearInstalled: z.number().int({ error: 'must be a whole number' }).min(1900, { error: 'must be 1900 or later' }).max(2200, { error: 'must be 2200 or earlier' }).optional(),
    /** Static head / design head of a pump system [-]. */
    staticHeadFraction: nonNegative(0.95).optional(),
    /** IEC 61800-9-2 class of a drive already fitted (controlMethod variable-speed-drive). */
    driveClass: driveClassSchema.optional(),
    /** A sized BLDC's own part-load curve, replacing the generic permanent-magnet model. */
    bldcCurve: partLoadCurveSchema.optional(),
  })
  .refine((motor) => motor.poles !== undefined || motor.speedRpm !== undefined, {
    error: 'or speedRpm is required',
    path: ['poles'],
  });

export const timeOfUseSchema = z
  .array(
    z.object({
      period: z.string(),
      pricePerKwh: nonNegative(),
      hoursShare: nonNegative(1),
    }),
  )
  .min(1, { error: 'needs at least one period' });

export const siteSchema = z
  .object({
    name: z.string().optional(),
    voltageV: positive(15000).optional(),
    frequencyHz: frequencySchema.optional(),
    energyPricePerKwh: nonNegative().optional(),
    timeOfUse: timeOfUseSchema.optional(),
    demandChargePerKwMonth: nonNegative().optional(),
    currency: z.string().regex(/^[A-Z]{3}$/, { error: 'must be a three-letter ISO 4217 code' }).optional(),
    co2KgPerKwh: nonNegative(2).optional(),
    defaultHoursPerYear: nonNegative(MAX_HOURS_PER_YEAR).optional(),
  })
  .refine((site) => site.energyPricePerKwh !== undefined || site.timeOfUse !== undefined, {
    error: 'is required unless timeOfUse is given',
    path: ['energyPricePerKwh'],
  });

const priceBandSchema = z.object({ upToKw: positive(), costPerKw: nonNegative(), fixedCost: nonNegative() });
const installationSchema = z.object({ fixedCost: nonNegative(), costPerKw: nonNegative() });
const rebateSchema = z.object({ fraction: nonNegative(1).optional(), perKw: nonNegative().optional(), fixed: nonNegative().optional() });

/** A price book; every part is optional and falls back to DEFAULT_PRICE_BOOK item by item. */
export const priceBookSchema = z.object({
  currency: z.string().regex(/^[A-Z]{3}$/, { error: 'must be a three-letter ISO 4217 code' }).optional(),
  items: z
    .partialRecord(
      z.enum(['rewind', 'ie3', 'ie4', 'ie5', 'bldc', 'vsd']),
      z
        .array(priceBandSchema)
        .min(1, { error: 'needs at least one size band' })
        .refine((bands) => bands.every((band, index) => index === 0 || band.upToKw > bands[index - 1]!.upToKw), {
          error: 'must be sorted by upToKw, strictly increasing',
        }),
    )
    .optional(),
  motorInstallation: installationSchema.optional(),
  driveInstallation: installationSchema.optional(),
  rebates: z.record(z.string(), rebateSchema).optional(),
});

const lifeSchema = z.number().int({ error: 'must be a whole number' }).min(1, { error: 'must be 1 or more' }).max(50, { error: 'must be at most 50' });

/** Assumptions the user may change; each one left out takes its documented default. */
export const assumptionsSchema = z.object({
  discountRatePct: z.number().min(-50, { error: 'must be -50 or more' }).max(100, { error: 'must be at most 100' }).optional(),
  energyEscalationPct: z.number().min(-20, { error: 'must be -20 or more' }).max(50, { error: 'must be at most 50' }).optional(),
  lifeYears: z
    .object({ keep: lifeSchema, rewind: lifeSchema, ie3: lifeSchema, ie4: lifeSchema, ie5: lifeSchema, bldc: lifeSchema, vsd: lifeSchema })
    .partial()
    .optional(),
  rewindPenaltyPctPoints: nonNegative(10).optional(),
  defaultHoursPerYear: nonNegative(MAX_HOURS_PER_YEAR).optional(),
  defaultLoadFactor: nonNegative(1.25).optional(),
  unknownClassLossFactor: z.number().min(1, { error: 'must be 1 or more' }).max(3, { error: 'must be at most 3' }).optional(),
  newDriveClass: driveClassSchema.optional(),
  co2KgPerKwh: nonNegative(2).optional(),
});

/** Input of the `assess` command and of POST endpoints that run an assessment. */
export const assessInputSchema = z.object({
  motor: motorSchema,
  site: siteSchema,
  priceBook: priceBookSchema.optional(),
  assumptions: assumptionsSchema.optional(),
});

export type MotorInput = z.infer<typeof motorSchema>;
export type SiteInput = z.infer<typeof siteSchema>;
export type PriceBookInput = z.infer<typeof priceBookSchema>;
export type AssumptionsInput = z.infer<typeof assumptionsSchema>;
export type AssessInput = z.infer<typeof assessInputSchema>;
export type DutyBin = z.infer<typeof dutyBinSchema>;
export type EfficiencyClassInput = z.infer<typeof efficiencyClassSchema>;
