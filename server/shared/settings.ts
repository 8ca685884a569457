/**
 * Settings of an organisation (`/api/settings`): the price book, the assessment assumptions and the
 * BLDC material library. Everyone reads; admins edit the price book and the assumptions; engineers
 * and admins edit the material library (custom magnet grades and lamination steels).
 *
 * Stored values are what the admin gave; what is not given falls back to calc's defaults
 * (DEFAULT_PRICE_BOOK, calc/assess/defaults.ts), and the answer says which parts are defaults.
 */
import { z } from 'zod';
import { assumptionsSchema, priceBookSchema, type AssumptionsInput, type PriceBookInput } from '../../calc/assess/schema.js';
import { sizeBldcInputSchema } from '../../calc/bldc/commands.js';
import type { LaminationSteel, MagnetGrade } from '../../calc/bldc/materials.js';
import type { PriceBook } from '../../calc/economics/price-book.js';
import { versionField } from './common.js';

export { assumptionsSchema, priceBookSchema };
export type { AssumptionsInput, PriceBookInput, PriceBook, MagnetGrade, LaminationSteel };

/** calc/bldc's own shapes of a custom magnet and steel (the `magnet`/`steel` objects of size-bldc). */
export const magnetShape = sizeBldcInputSchema.shape.magnet.unwrap().options[1];
export const steelShape = sizeBldcInputSchema.shape.steel.unwrap().options[1];

/** `PUT /api/settings/price-book` (admin): calc's price book and the version loaded. */
export const priceBookUpdateBody = priceBookSchema.extend({ version: versionField });
/** `PUT /api/settings/assumptions` (admin): calc's assumptions and the version loaded. */
export const assumptionsUpdateBody = assumptionsSchema.extend({ version: versionField });

export const MATERIAL_KINDS = ['magnet', 'steel'] as const;
export type MaterialKind = (typeof MATERIAL_KINDS)[number];

const materialName = z.string().trim().min(1, 'is required').max(60, 'must be at most 60 characters');

/** `POST /api/settings/materials`: `{kind: 'magnet', ...MagnetGrade}` or `{kind: 'steel', ...LaminationSteel}`. */
export const materialCreateBody = z.discriminatedUnion(
  'kind',
  [magnetShape.extend({ kind: z.literal('magnet'), name: materialName }), steelShape.extend({ kind: z.literal('steel'), name: materialName })],
  { error: 'must be magnet or steel' },
);
export type MaterialCreate = z.infer<typeof materialCreateBody>;

/** `PATCH /api/settings/materials/:id`: any fields of the material's kind and the version loaded. */
export const materialUpdateBody = z
  .object({ ...magnetShape.partial().shape, ...steelShape.partial().shape, name: materialName.optional() })
  .extend({ version: versionField });
export type MaterialUpdate = z.infer<typeof materialUpdateBody>;
export const materialDeleteQuery = z.object({ version: z.coerce.number().int().min(0).optional() });

/** A material of the library: a built-in grade of calc/bldc (id null, read-only) or a custom one. */
export const magnetOutput = magnetShape.extend({
  id: z.number().int().nullable(),
  kind: z.literal('magnet'),
  builtIn: z.boolean(),
  version: z.number().int(),
});
export const steelOutput = steelShape.extend({
  id: z.number().int().nullable(),
  kind: z.literal('steel'),
  builtIn: z.boolean(),
  version: z.number().int(),
});
export const materialOutput = z.union([magnetOutput, steelOutput]);
export type MagnetOutput = z.infer<typeof magnetOutput>;
export type SteelOutput = z.infer<typeof steelOutput>;
export type MaterialOutput = z.infer<typeof materialOutput>;

/** `GET /api/settings`. */
export const settingsOutput = z.object({
  priceBook: z.object({
    /** The complete price book in use: stored parts, calc's DEFAULT_PRICE_BOOK for the rest. */
    value: z.custom<PriceBook>((value) => typeof value === 'object' && value !== null),
    /** What the admin stored (null: nothing, all defaults). */
    stored: priceBookSchema.nullable(),
    /** Parts taken from calc's defaults (`items.ie4`, `motorInstallation`…). */
    defaulted: z.array(z.string()),
    version: z.number().int(),
  }),
  assumptions: z.object({
    /** Every assumption in use: stored values, calc's defaults for the rest. */
    value: z.record(z.string(), z.unknown()),
    stored: assumptionsSchema.nullable(),
    /** Assumption names taken from calc's defaults. */
    defaulted: z.array(z.string()),
    version: z.number().int(),
  }),
  materials: z.object({ magnets: z.array(magnetOutput), steels: z.array(steelOutput) }),
});
export type SettingsOutput = z.infer<typeof settingsOutput>;
