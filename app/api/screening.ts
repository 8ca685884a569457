// Site screening as a background job (`POST /api/sites/:id/screening`, `GET /api/jobs/:id`) and the
// retrofit proposals made from its rows (`POST /api/screenings/:jobId/proposals`).
import type { z } from 'zod';
import type { JobOutput, proposalsCreated, screeningStartBody } from 'shared/screening';
import { api } from './client';

export type ScreeningStartInput = z.input<typeof screeningStartBody>;
export type ProposalsCreated = z.infer<typeof proposalsCreated>;

export const screeningApi = {
  start: (siteId: number, body: ScreeningStartInput) =>
    api.post<{ jobId: number }>(`/api/sites/${siteId}/screening`, body),
  job: (jobId: number) => api.get<JobOutput>(`/api/jobs/${jobId}`),
  cancel: (jobId: number) => api.post<JobOutput>(`/api/jobs/${jobId}/cancel`),
  propose: (jobId: number, motorIds: number[]) =>
    api.post<ProposalsCreated>(`/api/screenings/${jobId}/proposals`, { motorIds }),
};
