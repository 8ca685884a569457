/**
 * Quick studies (`/api/studies`): one motor assessed against every retrofit option, stored with its
 * input and result. Shared by the server (validation, OpenAPI) and the client (forms, types).
 *
 * - `POST /api/studies` takes the `assess` command's JSON ({motor, site, priceBook?, assumptions?},
 *   calc's `assessInputSchema`) plus optional `name` and `motorId`; the server recomputes with calc's
 *   `assess` (the organisation's price book and assumptions fill what the input leaves out) and
 *   answers the result plus `id` (`studyCreated`).
 * - `POST /api/studies/from-motor/:motorId` builds that input from a register motor (motor, its
 *   site's tariff, the organisation's settings, the motor's linked BLDC design) and answers
 *   `{input, result}` without saving (`studyPreview`); the client shows it and may save `input`.
 * - `GET /api/studies` (list), `GET /api/studies/:id` (`studyOutput`), `DELETE /api/studies/:id`.
 */
import { z } from 'zod';
import type { AssessResult } from '../../calc/assess/assess.js';
import { assessInputSchema, type AssessInput } from '../../calc/assess/schema.js';
import { listOf, listQuery } from './common.js';

export { assessInputSchema };
export type { AssessInput, AssessResult };

/** calc's AssessResult (baseline, options, recommended, assumptions); documented in calc/assess/assess.ts. */
export const assessResultSchema = z.custom<AssessResult>((value) => typeof value === 'object' && value !== null);

/** `POST /api/studies`: the `assess` input plus a name and the register motor it is about. */
export const studyCreateBody = assessInputSchema.extend({
  name: z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters').optional(),
  motorId: z.number().int().positive().optional(),
});
export type StudyCreate = z.infer<typeof studyCreateBody>;

/** Answer of `POST /api/studies`: the assess result (exactly the command line's) plus the new id. */
export const studyCreated = z.custom<AssessResult & { id: number }>((value) => typeof value === 'object' && value !== null);
export type StudyCreated = AssessResult & { id: number };

/** Answer of `POST /api/studies/from-motor/:motorId`: the built input and its (unsaved) result. */
export const studyPreview = z.object({
  input: assessInputSchema,
  result: assessResultSchema,
  /** The linked BLDC design whose part-load curve the BLDC options used, if any. */
  bldcDesignId: z.number().int().nullable(),
  /** Where each part of the input came from (site tariff, organisation settings, calc defaults). */
  sources: z.array(z.string()),
});
export type StudyPreview = z.infer<typeof studyPreview>;
export const fromMotorParams = z.object({ motorId: z.coerce.number().int().positive() });

const studySummaryShape = {
  id: z.number().int(),
  name: z.string(),
  motorId: z.number().int().nullable(),
  motorTag: z.string().nullable(),
  siteName: z.string().nullable(),
  ratedPowerKw: z.number(),
  currency: z.string().nullable(),
  /** Recommended option code (`keep` when nothing pays). */
  recommendedCode: z.string(),
  recommendedLabel: z.string(),
  /** Figures of the recommended option (0 for keep) [kWh/a, currency/a, currency]. */
  savingsKwh: z.number(),
  savingsCost: z.number(),
  npv: z.number(),
  createdById: z.number().int().nullable(),
  createdByName: z.string().nullable(),
  createdAt: z.string(),
};

export const studyListItem = z.object(studySummaryShape);
export type StudyListItem = z.infer<typeof studyListItem>;

/** `GET /api/studies/:id`: the summary, the stored input and the stored result. */
export const studyOutput = z.object({ ...studySummaryShape, input: assessInputSchema, result: assessResultSchema });
export type StudyOutput = z.infer<typeof studyOutput>;

export const STUDY_SORT_FIELDS = ['createdAt', 'name', 'savingsCost', 'npv'] as const;
export const studyListQuery = listQuery(STUDY_SORT_FIELDS, '-createdAt').extend({
  q: z.string().trim().max(100).optional(),
  motorId: z.coerce.number().int().positive().optional(),
});
export type StudyListQuery = z.infer<typeof studyListQuery>;
export const studyList = listOf(studyListItem);
