import { route, type RouteSpec } from '../lib/routing.js';
import { attachmentHeader, parseFormFields, receiveFile } from '../lib/uploads.js';
import { idParams } from '../shared/common.js';
import {
  IMPORT_LIMITS,
  importCommitResult,
  importDetail,
  importDetailQuery,
  importList,
  importListQuery,
  importMappingBody,
  importPreviewResult,
  importUndoResult,
  importUploadBody,
} from '../shared/intake.js';
import { EDITORS } from '../shared/roles.js';
import { commitImport, createImport, getImport, listImports, remapImport, undoImport } from './service.js';
import { importTemplate } from './template.js';

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

export const intakeRoutes: RouteSpec[] = [
  route({
    method: 'get',
    path: '/imports/template',
    summary: 'The import template (.xlsx): every field with its unit, and a sheet explaining each column',
    tag: 'imports',
    access: 'signed-in',
    produces: XLSX_TYPE,
    handler: async ({ res }) => {
      res.setHeader('Content-Type', XLSX_TYPE);
      res.setHeader('Content-Disposition', attachmentHeader('statorline-motor-import-template.xlsx'));
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.status(200).end(importTemplate());
    },
  }),
  route({
    method: 'get',
    path: '/imports',
    summary: 'Import batches: who, when, file, counts, status',
    tag: 'imports',
    access: 'signed-in',
    query: importListQuery,
    response: importList,
    handler: ({ tenant, query }) => listImports(tenant, query),
  }),
  route({
    method: 'post',
    path: '/imports',
    summary: 'Upload a motor list (multipart: file .xlsx/.xls/.csv up to 25 MB, siteId, optional mapping JSON) → preview with row errors',
    tag: 'imports',
    access: EDITORS,
    response: importPreviewResult,
    status: 201,
    handler: async ({ tenant, req, res }) => {
      const { file, fields } = await receiveFile(req, res, IMPORT_LIMITS.maxFileBytes);
      const input = parseFormFields(importUploadBody, fields);
      return createImport(tenant, file, input);
    },
  }),
  route({
    method: 'get',
    path: '/imports/:id',
    summary: 'An import: status, progress, counts, issues, and a page of its rows (filter all/valid/invalid/warning)',
    tag: 'imports',
    access: 'signed-in',
    params: idParams,
    query: importDetailQuery,
    response: importDetail,
    handler: ({ tenant, params, query }) => getImport(tenant, params.id, query),
  }),
  route({
    method: 'put',
    path: '/imports/:id/mapping',
    summary: 'Change the column mapping of a preview and validate again (remembered for the organisation)',
    tag: 'imports',
    access: EDITORS,
    params: idParams,
    body: importMappingBody,
    response: importPreviewResult,
    handler: ({ tenant, params, body }) => remapImport(tenant, params.id, body.mapping),
  }),
  route({
    method: 'post',
    path: '/imports/:id/commit',
    summary: 'Commit the valid rows in one transaction (all or nothing); rows with errors are skipped',
    tag: 'imports',
    access: EDITORS,
    params: idParams,
    response: importCommitResult,
    handler: ({ tenant, params }) => commitImport(tenant, params.id),
  }),
  route({
    method: 'delete',
    path: '/imports/:id',
    summary: 'Undo a committed import (restore updated motors, remove created ones) or discard a preview',
    tag: 'imports',
    access: EDITORS,
    params: idParams,
    response: importUndoResult,
    handler: ({ tenant, params }) => undoImport(tenant, params.id),
  }),
];
