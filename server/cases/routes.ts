import type { Mailer } from '../lib/mail.js';
import { route, type RouteSpec } from '../lib/routing.js';
import { attachmentHeader } from '../lib/uploads.js';
import { caseCreateBody, caseDecided, caseDecisionBody, caseExportQuery, caseList, caseListQuery, caseOutput, caseSendBody, caseSent } from '../shared/case.js';
import { idParams } from '../shared/common.js';
import { EDITORS } from '../shared/roles.js';
import { casePdf } from './pdf.js';
import { caseRow, createCase, decideCase, exportFileName, getCaseJson, getCaseJsonGzip, listCases, sendCase } from './service.js';
import { caseWorkbook } from './xlsx.js';

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** `/api/cases`: generate (engineers, admins), read (everyone signed in), send (engineers, admins), decide (approvers). */
export function caseRoutes(mailer: Mailer, publicUrl: string): RouteSpec[] {
  return [
    route({
      method: 'get',
      path: '/cases',
      summary: 'List business cases (scope, site, version, status, who and when, headline figures)',
      tag: 'cases',
      access: 'signed-in',
      query: caseListQuery,
      response: caseList,
      handler: ({ tenant, query }) => listCases(tenant, query),
    }),
    route({
      method: 'post',
      path: '/cases',
      summary: 'Generate a business case snapshot for a site ({siteId}) or the whole organisation ({all: true})',
      tag: 'cases',
      access: EDITORS,
      body: caseCreateBody,
      response: caseOutput,
      status: 201,
      handler: ({ tenant, body }) => createCase(tenant, body),
    }),
    route({
      method: 'get',
      path: '/cases/:id',
      summary: 'One business case snapshot with its results',
      tag: 'cases',
      access: 'signed-in',
      params: idParams,
      response: caseOutput,
      // Sent as text: the stored results go out without being parsed and serialised again (getCaseJson),
      // gzipped once per state of the case for clients that accept it (getCaseJsonGzip).
      handler: async ({ tenant, params, req, res }) => {
        const gzip = /\bgzip\b/.test(req.get('accept-encoding') ?? '');
        // Headers only once the body is there: a 404 goes out through the error handler, uncompressed.
        const body = gzip ? await getCaseJsonGzip(tenant, params.id) : await getCaseJson(tenant, params.id);
        res.setHeader('Content-Type', 'application/json; charset=utf-8');
        res.setHeader('Vary', 'Accept-Encoding');
        if (gzip) res.setHeader('Content-Encoding', 'gzip');
        res.status(200).end(body);
      },
    }),
    route({
      method: 'get',
      path: '/cases/:id/export',
      summary: 'The business case as .xlsx (summary and a sheet per site) or PDF',
      tag: 'cases',
      access: 'signed-in',
      params: idParams,
      query: caseExportQuery,
      produces: `${XLSX_TYPE} | application/pdf`,
      handler: async ({ tenant, params, query, res }) => {
        const row = await caseRow(tenant, params.id);
        const content = query.format === 'xlsx' ? caseWorkbook(row) : await casePdf(row);
        res.setHeader('Content-Type', query.format === 'xlsx' ? XLSX_TYPE : 'application/pdf');
        res.setHeader('Content-Disposition', attachmentHeader(exportFileName(row, query.format)));
        res.setHeader('X-Content-Type-Options', 'nosniff');
        res.setHeader('Cache-Control', 'private, no-store');
        res.status(200).end(content);
      },
    }),
    route({
      method: 'post',
      path: '/cases/:id/send',
      summary: 'E-mail the business case with its PDF to the organisation’s approvers and the given addresses',
      tag: 'cases',
      access: EDITORS,
      params: idParams,
      body: caseSendBody,
      response: caseSent,
      handler: ({ tenant, params, body }) => sendCase(tenant, params.id, body, mailer, publicUrl),
    }),
    route({
      method: 'post',
      path: '/cases/:id/decision',
      summary: 'Approve or reject a business case (approvers); approval moves its motors to approved in the Retrofit log',
      tag: 'cases',
      access: ['approver'],
      params: idParams,
      body: caseDecisionBody,
      response: caseDecided,
      handler: ({ tenant, params, body }) => decideCase(tenant, params.id, body, mailer, publicUrl),
    }),
  ];
}
