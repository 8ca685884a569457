import { route, type RouteSpec } from '../lib/routing.js';
import { idParams } from '../shared/common.js';
import { EDITORS } from '../shared/roles.js';
import {
  assumptionsUpdateBody,
  materialCreateBody,
  materialDeleteQuery,
  materialOutput,
  materialUpdateBody,
  priceBookUpdateBody,
  settingsOutput,
} from '../shared/settings.js';
import { createMaterial, deleteMaterial, getSettings, updateAssumptions, updateMaterial, updatePriceBook } from './service.js';

const ADMINS = ['admin'] as const;

export const settingsRoutes: RouteSpec[] = [
  route({
    method: 'get',
    path: '/settings',
    summary: 'Price book, assumptions and material library of the organisation (calc defaults where nothing is stored)',
    tag: 'settings',
    access: 'signed-in',
    response: settingsOutput,
    handler: ({ tenant }) => getSettings(tenant),
  }),
  route({
    method: 'put',
    path: '/settings/price-book',
    summary: 'Replace the price book (send the version you loaded)',
    tag: 'settings',
    access: ADMINS,
    body: priceBookUpdateBody,
    response: settingsOutput,
    handler: ({ tenant, body }) => updatePriceBook(tenant, body),
  }),
  route({
    method: 'put',
    path: '/settings/assumptions',
    summary: 'Replace the assessment assumptions (send the version you loaded)',
    tag: 'settings',
    access: ADMINS,
    body: assumptionsUpdateBody,
    response: settingsOutput,
    handler: ({ tenant, body }) => updateAssumptions(tenant, body),
  }),
  route({
    method: 'post',
    path: '/settings/materials',
    summary: 'Add a custom magnet grade or lamination steel',
    tag: 'settings',
    access: EDITORS,
    body: materialCreateBody,
    response: materialOutput,
    status: 201,
    handler: ({ tenant, body }) => createMaterial(tenant, body),
  }),
  route({
    method: 'patch',
    path: '/settings/materials/:id',
    summary: 'Edit a custom material (send the version you loaded)',
    tag: 'settings',
    access: EDITORS,
    params: idParams,
    body: materialUpdateBody,
    response: materialOutput,
    handler: ({ tenant, params, body }) => updateMaterial(tenant, params.id, body),
  }),
  route({
    method: 'delete',
    path: '/settings/materials/:id',
    summary: 'Remove a custom material (designs that used it keep their stored copy)',
    tag: 'settings',
    access: EDITORS,
    params: idParams,
    query: materialDeleteQuery,
    status: 204,
    handler: async ({ tenant, params, query }) => {
      await deleteMaterial(tenant, params.id, query.version);
    },
  }),
];
