/**
 * BLDC designs (`/api/designs`): a surface-PM brushless motor sized by calc's `sizeBldc`, stored with
 * its input and result, simulated, mapped, swept, and linked to a register motor so that the motor's
 * BLDC options in every assessment use the design's part-load curve.
 *
 * - `POST /api/designs`: the `size-bldc` input (calc's `sizeBldcInputSchema`) plus optional `motorId`
 *   and `name` → the result plus `id` (`designCreated`). Without `minEfficiencyPct` the server passes
 *   the IE4 efficiency of the rating (IEC 60034-30-1 via calc/efficiency) so that a design never lands
 *   below IE4 by default; `appliedDefaults` says so. A magnet or steel named after one of the
 *   organisation's custom materials is replaced by that material.
 * - `GET /api/designs`, `GET /api/designs/:id`.
 * - `POST /api/designs/:id/simulate`: calc's `simulate` options without `params`/`design` → summary +
 *   series (at most SIMULATION_MAX_POINTS points), run in a worker thread with a time limit.
 * - `POST /api/designs/:id/efficiency-map` {speedsRpm, torquesNm} → calc's EfficiencyMap.
 * - `POST /api/designs/sweep`: calc's `sweep` input → {parameter, rows}.
 * - `POST /api/motors/:id/design` {designId | null} links (or unlinks) the motor's BLDC design.
 */
import { z } from 'zod';
import type { BldcResult } from '../../calc/bldc/search.js';
import { sizeBldcInputSchema, sweepInputSchema } from '../../calc/bldc/commands.js';
import { simulateInputSchema } from '../../calc/dynamics/commands.js';
import type { SimulateOutput } from '../../calc/dynamics/commands.js';
import type { EfficiencyMap } from '../../calc/dynamics/efficiency-map.js';
import type { SweepRow } from '../../calc/bldc/sweep.js';
import { listOf, listQuery } from './common.js';

export { sizeBldcInputSchema, sweepInputSchema, simulateInputSchema };
export type { BldcResult, SimulateOutput, EfficiencyMap, SweepRow };

const anyObject = <T>() => z.custom<T>((value) => typeof value === 'object' && value !== null);

export type SizeBldcInput = z.infer<typeof sizeBldcInputSchema>;

/** `POST /api/designs`. */
export const designCreateBody = sizeBldcInputSchema.extend({
  name: z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters').optional(),
  motorId: z.number().int().positive().optional(),
});
export type DesignCreate = z.infer<typeof designCreateBody>;

/** Answer of `POST /api/designs`: calc's BldcResult, the new id, and the defaults the server applied. */
export type DesignCreated = BldcResult & { id: number; appliedDefaults: string[] };
export const designCreated = anyObject<DesignCreated>();

const designSummaryShape = {
  id: z.number().int(),
  name: z.string(),
  /** The motor the design was sized for (input), if any. */
  motorId: z.number().int().nullable(),
  motorTag: z.string().nullable(),
  /** Register motors whose BLDC option uses this design. */
  linkedMotorIds: z.array(z.number().int()),
  ratedPowerKw: z.number(),
  speedRpm: z.number(),
  feasible: z.boolean(),
  limitingConstraint: z.string(),
  slots: z.number().int().nullable(),
  poles: z.number().int().nullable(),
  frame: z.string().nullable(),
  efficiencyPct: z.number().nullable(),
  systemEfficiencyPct: z.number().nullable(),
  activeMaterialCost: z.number().nullable(),
  totalMassKg: z.number().nullable(),
  createdById: z.number().int().nullable(),
  createdByName: z.string().nullable(),
  createdAt: z.string(),
};
export const designListItem = z.object(designSummaryShape);
export type DesignListItem = z.infer<typeof designListItem>;

/** `GET /api/designs/:id`: the summary, the input as stored (after server defaults) and the result. */
export const designOutput = z.object({
  ...designSummaryShape,
  input: z.record(z.string(), z.unknown()),
  appliedDefaults: z.array(z.string()),
  result: anyObject<BldcResult>(),
});
export type DesignOutput = z.infer<typeof designOutput>;

export const DESIGN_SORT_FIELDS = ['createdAt', 'name', 'ratedPowerKw'] as const;
export const designListQuery = listQuery(DESIGN_SORT_FIELDS, '-createdAt').extend({
  q: z.string().trim().max(100).optional(),
  motorId: z.coerce.number().int().positive().optional(),
});
export type DesignListQuery = z.infer<typeof designListQuery>;
export const designList = listOf(designListItem);

/** Most points of each series a simulation answers. */
export const SIMULATION_MAX_POINTS = 2000;
/** Wall-clock limit of one simulation or sweep in its worker [ms]. */
export const DESIGN_WORKER_TIME_LIMIT_MS = 60_000;

/** `POST /api/designs/:id/simulate`: calc's `simulate` options; the design supplies the parameters. */
export const designSimulateBody = simulateInputSchema.omit({ params: true, design: true }).extend({
  outputPoints: z.number().int('must be a whole number').min(2, 'must be at least 2').max(SIMULATION_MAX_POINTS, `must be at most ${SIMULATION_MAX_POINTS}`).optional(),
});
export type DesignSimulate = z.infer<typeof designSimulateBody>;
export const designSimulateOutput = anyObject<SimulateOutput>();

/** `POST /api/designs/:id/efficiency-map`. calc allows up to 200 values on each axis. */
export const designEfficiencyMapBody = z.object({
  speedsRpm: z.array(z.number().positive('must be positive')).min(1, 'needs at least one speed').max(200, 'has at most 200 speeds'),
  torquesNm: z.array(z.number().min(0, 'must be zero or more')).min(1, 'needs at least one torque').max(200, 'has at most 200 torques'),
});
export const designEfficiencyMapOutput = anyObject<EfficiencyMap>();

/** `POST /api/designs/sweep`: calc's `sweep` input ({base, parameter, from, to, steps}). */
export const designSweepBody = sweepInputSchema;
export const designSweepOutput = z.object({ parameter: z.string(), rows: z.array(anyObject<SweepRow>()) });

/** `POST /api/motors/:id/design`: `designId` null unlinks. `version`, when sent, must be the motor's. */
export const motorDesignLinkBody = z.object({
  designId: z.number().int().positive().nullable(),
  version: z.number().int().min(0).optional(),
});
export const motorDesignLinkOutput = z.object({ motorId: z.number().int(), designId: z.number().int().nullable(), version: z.number().int() });
