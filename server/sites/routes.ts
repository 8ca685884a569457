import { route, type RouteSpec } from '../lib/routing.js';
import { idParams } from '../shared/common.js';
import { EDITORS } from '../shared/roles.js';
import { siteCreateBody, siteList, siteListQuery, siteOutput, siteUpdateBody } from '../shared/site.js';
import { createSite, getSite, listSites, updateSite } from './service.js';

export const siteRoutes: RouteSpec[] = [
  route({
    method: 'get',
    path: '/sites',
    summary: 'List the organisation’s sites',
    tag: 'sites',
    access: 'signed-in',
    query: siteListQuery,
    response: siteList,
    handler: ({ tenant, query }) => listSites(tenant, query),
  }),
  route({
    method: 'post',
    path: '/sites',
    summary: 'Create a site',
    tag: 'sites',
    access: EDITORS,
    body: siteCreateBody,
    response: siteOutput,
    status: 201,
    handler: ({ tenant, body }) => createSite(tenant, body),
  }),
  route({
    method: 'get',
    path: '/sites/:id',
    summary: 'One site',
    tag: 'sites',
    access: 'signed-in',
    params: idParams,
    response: siteOutput,
    handler: ({ tenant, params }) => getSite(tenant, params.id),
  }),
  route({
    method: 'patch',
    path: '/sites/:id',
    summary: 'Edit, archive or restore a site (send the version you loaded)',
    tag: 'sites',
    access: EDITORS,
    params: idParams,
    body: siteUpdateBody,
    response: siteOutput,
    handler: ({ tenant, params, body }) => updateSite(tenant, params.id, body),
  }),
];
