// The local e-mail catcher (`/api/outbox`).
import type { z } from 'zod';
import type { ListResult } from 'shared/common';
import type { OutboxMessageOutput, outboxListQuery } from 'shared/outbox';
import { api, type QueryOf } from './client';

export type OutboxListQuery = QueryOf<z.output<typeof outboxListQuery>>;

export const outboxApi = {
  list: (query: OutboxListQuery = {}) => api.get<ListResult<OutboxMessageOutput>>('/api/outbox', query),
  get: (id: number) => api.get<OutboxMessageOutput>(`/api/outbox/${id}`),
  /** Where the browser downloads an attachment (a plain link: the session cookie goes with it). */
  attachmentUrl: (messageId: number, attachmentId: number) =>
    api.url(`/api/outbox/${messageId}/attachments/${attachmentId}`),
};
