import { route, type RouteSpec } from '../lib/routing.js';
import { idParams } from '../shared/common.js';
import { EDITORS } from '../shared/roles.js';
import { fromMotorParams, studyCreateBody, studyCreated, studyList, studyListQuery, studyOutput, studyPreview } from '../shared/study.js';
import { createStudy, deleteStudy, getStudy, listStudies, previewFromMotor } from './service.js';

export const studyRoutes: RouteSpec[] = [
  route({
    method: 'get',
    path: '/studies',
    summary: 'List saved quick studies',
    tag: 'studies',
    access: 'signed-in',
    query: studyListQuery,
    response: studyList,
    handler: ({ tenant, query }) => listStudies(tenant, query),
  }),
  route({
    method: 'post',
    path: '/studies',
    summary: 'Assess one motor (the `assess` command’s input) and save the study; answers the result plus id',
    tag: 'studies',
    access: EDITORS,
    body: studyCreateBody,
    response: studyCreated,
    status: 201,
    handler: ({ tenant, body }) => createStudy(tenant, body),
  }),
  route({
    method: 'post',
    path: '/studies/from-motor/:motorId',
    summary: 'Assess a register motor with its site’s tariff, the settings and its linked BLDC design (not saved)',
    tag: 'studies',
    access: 'signed-in',
    params: fromMotorParams,
    response: studyPreview,
    handler: ({ tenant, params }) => previewFromMotor(tenant, params.motorId),
  }),
  route({
    method: 'get',
    path: '/studies/:id',
    summary: 'One saved study with its input and result',
    tag: 'studies',
    access: 'signed-in',
    params: idParams,
    response: studyOutput,
    handler: ({ tenant, params }) => getStudy(tenant, params.id),
  }),
  route({
    method: 'delete',
    path: '/studies/:id',
    summary: 'Delete a saved study',
    tag: 'studies',
    access: EDITORS,
    params: idParams,
    status: 204,
    handler: async ({ tenant, params }) => {
      await deleteStudy(tenant, params.id);
    },
  }),
];
