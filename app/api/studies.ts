// Quick studies (`/api/studies`) and the register lookup the Quick study starts from.
import type { z } from 'zod';
import type { ListResult } from 'shared/common';
import type { MotorOutput } from 'shared/motor';
import type { StudyCreate, StudyCreated, StudyListItem, StudyOutput, StudyPreview, studyListQuery } from 'shared/study';
import { api, type QueryOf } from './client';

export type StudyListQuery = QueryOf<z.output<typeof studyListQuery>>;

export const studiesApi = {
  list: (query: StudyListQuery = {}) => api.get<ListResult<StudyListItem>>('/api/studies', query),
  get: (id: number) => api.get<StudyOutput>(`/api/studies/${id}`),
  /** Saves: the server recomputes with calc's `assess` and answers the stored result plus its id. */
  create: (body: StudyCreate) => api.post<StudyCreated>('/api/studies', body),
  /** The assess input built from a register motor and its (unsaved) result. */
  fromMotor: (motorId: number) => api.post<StudyPreview>(`/api/studies/from-motor/${motorId}`),
  remove: (id: number) => api.delete(`/api/studies/${id}`),
  /** Register motors matching a search (tag, description), for the "start from a motor" picker. */
  searchMotors: (q: string, siteId?: number) =>
    api.get<ListResult<MotorOutput>>('/api/motors', { q, siteId, pageSize: 20, sort: 'tag' }),
};
