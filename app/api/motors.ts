// Motors (`/api/motors`): the register, one motor, its measurements, files and history.
import type { z } from 'zod';
import type { ListResult } from 'shared/common';
import type {
  MeasurementCreate,
  MeasurementOutput,
  MotorCreate,
  MotorFileOutput,
  MotorHistoryItem,
  MotorOutput,
  motorExportQuery,
  motorListQuery,
  motorUpdateBody,
  MOTOR_FILE_KINDS,
} from 'shared/motor';
import { api, toQueryString, type QueryOf, type QueryValue } from './client';
import { downloadFile, listQueryString, uploadForm, type DownloadedFile, type UploadOptions } from './transfer';

export type MotorListQuery = QueryOf<z.output<typeof motorListQuery>>;
export type MotorExportQuery = QueryOf<z.output<typeof motorExportQuery>>;
export type MotorUpdate = z.input<typeof motorUpdateBody>;
export type MotorFileKind = (typeof MOTOR_FILE_KINDS)[number];

/** The list filters flattened for a query string: lists comma-separated, as the API reads them. */
export function motorQueryParams(query: MotorListQuery | MotorExportQuery): Record<string, QueryValue> {
  const params: Record<string, QueryValue> = {};
  for (const [key, value] of Object.entries(query) as [string, unknown][]) {
    if (Array.isArray(value)) {
      if (value.length > 0) params[key] = value.join(',');
    } else if (value === undefined || value === null || typeof value !== 'object') {
      params[key] = value as QueryValue;
    }
  }
  return params;
}

const motorPath = (id: number) => `/api/motors/${id}`;

export const motorsApi = {
  list: (query: MotorListQuery = {}) => api.get<ListResult<MotorOutput>>('/api/motors', motorQueryParams(query)),
  get: (id: number) => api.get<MotorOutput>(motorPath(id)),
  create: (body: MotorCreate) => api.post<MotorOutput>('/api/motors', body),
  update: (id: number, body: MotorUpdate) => api.patch<MotorOutput>(motorPath(id), body),
  /** Retire: the motor stays with its history and files (status `retired`); a stale version is a 409. */
  retire: (id: number, version: number) => api.delete<MotorOutput>(`${motorPath(id)}${toQueryString({ version })}`),
  history: (id: number, page = 1, pageSize = 50) =>
    api.get<ListResult<MotorHistoryItem>>(`${motorPath(id)}/history`, { page, pageSize }),
  measurements: (id: number) => api.get<{ items: MeasurementOutput[] }>(`${motorPath(id)}/measurements`),
  addMeasurement: (id: number, body: MeasurementCreate) => api.post<MeasurementOutput>(`${motorPath(id)}/measurements`, body),
  files: (id: number) => api.get<{ items: MotorFileOutput[] }>(`${motorPath(id)}/files`),
  uploadFile: (id: number, file: File, kind: MotorFileKind, options: UploadOptions = {}) => {
    const form = new FormData();
    form.append('kind', kind);
    form.append('file', file, file.name);
    return uploadForm<MotorFileOutput>(`${motorPath(id)}/files`, form, options);
  },
  /** The address of a file: an <img> source or a download link (the session cookie is enough for GET). */
  fileUrl: (id: number, fileId: number) => api.url(`${motorPath(id)}/files/${fileId}`),
  /** The register as .xlsx with the same filters and sort as the list. */
  exportXlsx: (query: MotorExportQuery = {}): Promise<DownloadedFile> =>
    downloadFile('/api/motors/export', motorQueryParams(query), 'motor-register.xlsx'),
  /** The export's address, for a plain link. */
  exportUrl: (query: MotorExportQuery = {}) => api.url(`/api/motors/export${listQueryString(motorQueryParams(query))}`),
};
