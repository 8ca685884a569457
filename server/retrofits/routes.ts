/**
 * The Retrofit log's API. `GET /api/retrofits` moved here from server/screening/ (same query and the
 * same fields, plus the log's own: dates, overdue flag, verified savings).
 */
import type { Mailer } from '../lib/mail.js';
import { route, type RouteSpec } from '../lib/routing.js';
import { parseFormFields, receiveFile } from '../lib/uploads.js';
import { idParams } from '../shared/common.js';
import {
  meterDataOutput,
  meterUploadFields,
  meterUploadResult,
  retrofitCreateBody,
  retrofitDetail,
  retrofitFileFields,
  retrofitFileOutput,
  retrofitFileParams,
  retrofitLogList,
  retrofitLogQuery,
  retrofitPatchBody,
  verificationOutput,
  verificationSummary as verificationSummarySchema,
  verificationSummaryQuery,
} from '../shared/retrofit.js';
import { EDITORS } from '../shared/roles.js';
import { z } from 'zod';
import { addRetrofitFile, listRetrofitFiles, RETROFIT_FILE_MAX_BYTES, sendRetrofitFile } from './files.js';
import { getMeterData, getVerification, METER_FILE_MAX_BYTES, uploadMeterData, verificationSummary } from './meter-data.js';
import { createRetrofit, getRetrofit, listRetrofitLog, patchRetrofit } from './service.js';

const TAG = 'retrofits';

export function retrofitRoutes(mailer: Mailer, publicUrl: string): RouteSpec[] {
  return [
    route({
      method: 'get',
      path: '/retrofits',
      summary: 'The Retrofit log: retrofits with filters status, siteId, motorId, overdue',
      tag: TAG,
      access: 'signed-in',
      query: retrofitLogQuery,
      response: retrofitLogList,
      handler: ({ tenant, query }) => listRetrofitLog(tenant, query),
    }),
    route({
      method: 'post',
      path: '/retrofits',
      summary: "An engineer's retrofit proposal for one motor (e-mails the approvers)",
      tag: TAG,
      access: EDITORS,
      body: retrofitCreateBody,
      response: retrofitDetail,
      status: 201,
      handler: ({ tenant, body }) => createRetrofit(tenant, mailer, publicUrl, body),
    }),
    // Before '/retrofits/:id', which would otherwise take 'verification-summary' for an id.
    route({
      method: 'get',
      path: '/retrofits/verification-summary',
      summary: 'Verified against predicted savings per site and for the organisation (installed and verified retrofits)',
      tag: TAG,
      access: 'signed-in',
      query: verificationSummaryQuery,
      response: verificationSummarySchema,
      handler: ({ tenant, query }) => verificationSummary(tenant, query.siteId),
    }),
    route({
      method: 'get',
      path: '/retrofits/:id',
      summary: 'A retrofit with its motor, history, files and the transitions open to the user',
      tag: TAG,
      access: 'signed-in',
      params: idParams,
      response: retrofitDetail,
      handler: ({ tenant, params }) => getRetrofit(tenant, params.id),
    }),
    route({
      method: 'patch',
      path: '/retrofits/:id',
      summary: 'A transition ({status, comment}) and/or the retrofit’s data, with the version read (403 role, 409 workflow or stale version)',
      tag: TAG,
      access: ['admin', 'engineer', 'approver'],
      params: idParams,
      body: retrofitPatchBody,
      response: retrofitDetail,
      handler: ({ tenant, params, body }) => patchRetrofit(tenant, mailer, publicUrl, params.id, body),
    }),
    route({
      method: 'post',
      path: '/retrofits/:id/meter-data',
      summary: 'Upload a period’s meter data (multipart: file (CSV), period, unit?, register?, scope?); replaces that period; a file with row errors is refused whole',
      tag: TAG,
      access: EDITORS,
      params: idParams,
      response: meterUploadResult,
      status: 201,
      handler: async ({ tenant, params, req, res }) => {
        const { file, fields } = await receiveFile(req, res, METER_FILE_MAX_BYTES);
        return uploadMeterData(tenant, params.id, file, parseFormFields(meterUploadFields, fields));
      },
    }),
    route({
      method: 'get',
      path: '/retrofits/:id/meter-data',
      summary: 'The stored meter data of both periods, with chart series (mean kW, null at gaps)',
      tag: TAG,
      access: 'signed-in',
      params: idParams,
      response: meterDataOutput,
      handler: ({ tenant, params }) => getMeterData(tenant, params.id),
    }),
    route({
      method: 'get',
      path: '/retrofits/:id/verification',
      summary: 'Verified savings (IPMVP option A or B), the method and formula, realised against predicted, uncertainty',
      tag: TAG,
      access: 'signed-in',
      params: idParams,
      response: verificationOutput,
      handler: ({ tenant, params }) => getVerification(tenant, params.id),
    }),
    route({
      method: 'get',
      path: '/retrofits/:id/files',
      summary: 'Documents and photos of a retrofit',
      tag: TAG,
      access: 'signed-in',
      params: idParams,
      response: z.object({ items: z.array(retrofitFileOutput) }),
      handler: ({ tenant, params }) => listRetrofitFiles(tenant, params.id),
    }),
    route({
      method: 'post',
      path: '/retrofits/:id/files',
      summary: 'Attach a document or photo (multipart: file, kind); JPEG, PNG, WebP or PDF, at most 15 MB',
      tag: TAG,
      access: EDITORS,
      params: idParams,
      response: retrofitFileOutput,
      status: 201,
      handler: async ({ tenant, params, req, res }) => {
        const { file, fields } = await receiveFile(req, res, RETROFIT_FILE_MAX_BYTES);
        const { kind } = parseFormFields(retrofitFileFields, fields);
        return addRetrofitFile(tenant, params.id, file, kind);
      },
    }),
    route({
      method: 'get',
      path: '/retrofits/:id/files/:fileId',
      summary: 'Download a file of a retrofit (as an attachment)',
      tag: TAG,
      access: 'signed-in',
      params: retrofitFileParams,
      produces: 'application/octet-stream',
      handler: ({ tenant, params, res }) => sendRetrofitFile(tenant, params.id, params.fileId, res),
    }),
  ];
}
