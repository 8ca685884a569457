// Sites (`/api/sites`).
import type { z } from 'zod';
import type { ListResult } from 'shared/common';
import type { SiteCreate, SiteOutput, siteListQuery, siteUpdateBody } from 'shared/site';
import { api, type QueryOf } from './client';

export type SiteListQuery = QueryOf<z.output<typeof siteListQuery>>;
export type SiteUpdate = z.input<typeof siteUpdateBody>;

export const sitesApi = {
  list: (query: SiteListQuery = {}) => api.get<ListResult<SiteOutput>>('/api/sites', query),
  get: (id: number) => api.get<SiteOutput>(`/api/sites/${id}`),
  create: (body: SiteCreate) => api.post<SiteOutput>('/api/sites', body),
  update: (id: number, body: SiteUpdate) => api.patch<SiteOutput>(`/api/sites/${id}`, body),
  /** Archive (or restore) keeps the row and its motors; it only hides the site from default lists. */
  setArchived: (id: number, archived: boolean, version: number) =>
    api.patch<SiteOutput>(`/api/sites/${id}`, { archived, version } satisfies SiteUpdate),
};
