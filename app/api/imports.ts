// Intake (`/api/imports`): spreadsheet imports of a motor list.
import type { z } from 'zod';
import type { ListResult } from 'shared/common';
import type {
  ImportBatchSummary,
  ImportCommitResult,
  ImportDetail,
  ImportMapping,
  ImportPreviewResult,
  importDetailQuery,
  importListQuery,
  importUndoResult,
} from 'shared/intake';
import { api, type QueryOf } from './client';
import { downloadFile, uploadForm, type DownloadedFile, type UploadOptions } from './transfer';

export type ImportDetailQuery = QueryOf<z.output<typeof importDetailQuery>>;
export type ImportListQuery = QueryOf<z.output<typeof importListQuery>>;
export type ImportRowFilter = z.output<typeof importDetailQuery>['filter'];
export type ImportUndoResult = z.output<typeof importUndoResult>;

export interface ImportUpload {
  file: File;
  siteId: number;
  /** Header → field (null ignores the column); left out, the server suggests one. */
  mapping?: ImportMapping;
}

const importPath = (id: number) => `/api/imports/${id}`;

export const importsApi = {
  list: (query: ImportListQuery = {}) => api.get<ListResult<ImportBatchSummary>>('/api/imports', query),
  /** Upload and validate: the batch as a preview (nothing is written to the register yet). */
  upload: (input: ImportUpload, options: UploadOptions = {}) => {
    const form = new FormData();
    form.append('siteId', String(input.siteId));
    if (input.mapping) form.append('mapping', JSON.stringify(input.mapping));
    form.append('file', input.file, input.file.name);
    return uploadForm<ImportPreviewResult>('/api/imports', form, options);
  },
  get: (id: number, query: ImportDetailQuery = {}) => api.get<ImportDetail>(importPath(id), query),
  remap: (id: number, mapping: ImportMapping) => api.put<ImportPreviewResult>(`${importPath(id)}/mapping`, { mapping }),
  commit: (id: number) => api.post<ImportCommitResult>(`${importPath(id)}/commit`),
  /** Undo a committed batch, or discard a preview. */
  undo: (id: number) => api.delete<ImportUndoResult>(importPath(id)),
  template: (): Promise<DownloadedFile> => downloadFile('/api/imports/template', {}, 'statorline-motor-import-template.xlsx'),
};
