// Business cases (`/api/cases`): generate a snapshot for a site or the whole organisation, list and
// read them, export them, e-mail them to the approvers and record an approver's decision.
import type { z } from 'zod';
import type {
  CaseCreate,
  CaseDecided,
  CaseDecisionInput,
  CaseList,
  CaseOutput,
  CaseSend,
  CaseSent,
  caseListQuery,
  EXPORT_FORMATS,
} from 'shared/case';
import { api, toQueryString, type QueryOf } from './client';

export type CaseListQuery = QueryOf<z.output<typeof caseListQuery>>;
export type CaseExportFormat = (typeof EXPORT_FORMATS)[number];

export const casesApi = {
  list: (query: CaseListQuery = {}) => api.get<CaseList>('/api/cases', query),
  get: (id: number) => api.get<CaseOutput>(`/api/cases/${id}`),
  /** Generates a new snapshot (a new version for its scope) and answers it whole. */
  create: (body: CaseCreate) => api.post<CaseOutput>('/api/cases', body),
  send: (id: number, body: CaseSend) => api.post<CaseSent>(`/api/cases/${id}/send`, body),
  decide: (id: number, body: CaseDecisionInput) => api.post<CaseDecided>(`/api/cases/${id}/decision`, body),
  /** Where the browser downloads an export (a plain link: the session cookie goes with it). */
  exportUrl: (id: number, format: CaseExportFormat) => api.url(`/api/cases/${id}/export${toQueryString({ format })}`),
};
