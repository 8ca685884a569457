import { route, type RouteSpec } from '../lib/routing.js';
import { idParams } from '../shared/common.js';
import { EDITORS } from '../shared/roles.js';
import {
  jobOutput,
  proposalCreateBody,
  proposalParams,
  proposalsCreated,
  screeningStartBody,
  screeningStarted,
} from '../shared/screening.js';
import { cancelJob, createProposals, getJob, startScreening } from './service.js';

export const screeningRoutes: RouteSpec[] = [
  route({
    method: 'post',
    path: '/sites/:id/screening',
    summary: 'Start screening the site’s motors (background job); poll GET /api/jobs/:jobId',
    tag: 'screening',
    access: EDITORS,
    params: idParams,
    body: screeningStartBody,
    response: screeningStarted,
    status: 202,
    handler: ({ tenant, params, body }) => startScreening(tenant, params.id, body),
  }),
  route({
    method: 'get',
    path: '/jobs/:id',
    summary: 'Status, progress and result of a background job',
    tag: 'jobs',
    access: 'signed-in',
    params: idParams,
    response: jobOutput,
    handler: ({ tenant, params }) => getJob(tenant, params.id),
  }),
  route({
    method: 'post',
    path: '/jobs/:id/cancel',
    summary: 'Cancel a queued or running job',
    tag: 'jobs',
    access: EDITORS,
    params: idParams,
    response: jobOutput,
    handler: ({ tenant, params }) => cancelJob(tenant, params.id),
  }),
  route({
    method: 'post',
    path: '/screenings/:jobId/proposals',
    summary: 'Turn rows of a finished screening into retrofit proposals',
    tag: 'screening',
    access: EDITORS,
    params: proposalParams,
    body: proposalCreateBody,
    response: proposalsCreated,
    status: 201,
    handler: ({ tenant, params, body }) => createProposals(tenant, params.jobId, body.motorIds),
  }),
  // GET /api/retrofits moved to server/retrofits/routes.ts (the Retrofit log, issue 9).
];
