import { z } from 'zod';

export const overviewResponse = z.object({
  organization: z.object({ id: z.number().int(), name: z.string() }),
  totals: z.object({ sites: z.number().int(), motors: z.number().int(), installedKw: z.number() }),
  sites: z.array(
    z.object({ id: z.number().int(), name: z.string(), motors: z.number().int(), installedKw: z.number() }),
  ),
  byApplication: z.array(z.object({ application: z.string(), motors: z.number().int(), installedKw: z.number() })),
});
export type OverviewResponse = z.infer<typeof overviewResponse>;
