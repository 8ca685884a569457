// The Retrofit log (`/api/retrofits`): list, one retrofit, transitions and data, files, meter data, verification.
import type { ListResult } from 'shared/common';
import type {
  MeterDataOutput,
  MeterPeriod,
  MeterRegister,
  MeterScope,
  MeterUnit,
  MeterUploadResult,
  RetrofitDetail,
  RetrofitFileKind,
  RetrofitFileOutput,
  RetrofitLogItem,
  RetrofitPatch,
  RetrofitStatus,
  VerificationOutput,
  VerificationSummary,
  retrofitCreateBody,
} from 'shared/retrofit';
import type { z } from 'zod';
import { api } from './client';
import { uploadForm, type UploadOptions } from './transfer';

export interface RetrofitListFilters {
  status?: RetrofitStatus | undefined;
  siteId?: number | undefined;
  motorId?: number | undefined;
  overdue?: 'true' | 'false' | undefined;
  page?: number;
  pageSize?: number;
  sort?: string;
}

const path = (id: number) => `/api/retrofits/${id}`;

export const retrofitsApi = {
  list: (query: RetrofitListFilters = {}) => api.get<ListResult<RetrofitLogItem>>('/api/retrofits', { ...query }),
  get: (id: number) => api.get<RetrofitDetail>(path(id)),
  /** An engineer's proposal for one motor (the approvers are e-mailed). */
  create: (body: z.input<typeof retrofitCreateBody>) => api.post<RetrofitDetail>('/api/retrofits', body),
  update: (id: number, body: RetrofitPatch) => api.patch<RetrofitDetail>(path(id), body),
  meterData: (id: number) => api.get<MeterDataOutput>(`${path(id)}/meter-data`),
  verification: (id: number) => api.get<VerificationOutput>(`${path(id)}/verification`),
  summary: (siteId?: number) => api.get<VerificationSummary>('/api/retrofits/verification-summary', { siteId }),
  uploadMeterData: (
    id: number,
    file: File,
    fields: { period: MeterPeriod; unit?: MeterUnit | null; register: MeterRegister; scope: MeterScope },
    options: UploadOptions = {},
  ) => {
    const form = new FormData();
    form.append('period', fields.period);
    if (fields.unit) form.append('unit', fields.unit);
    form.append('register', fields.register);
    form.append('scope', fields.scope);
    form.append('file', file);
    return uploadForm<MeterUploadResult>(`${path(id)}/meter-data`, form, options);
  },
  uploadFile: (id: number, file: File, kind: RetrofitFileKind, options: UploadOptions = {}) => {
    const form = new FormData();
    form.append('kind', kind);
    form.append('file', file);
    return uploadForm<RetrofitFileOutput>(`${path(id)}/files`, form, options);
  },
  fileUrl: (id: number, fileId: number) => api.url(`${path(id)}/files/${fileId}`),
};
