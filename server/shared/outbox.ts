import { z } from 'zod';
import { listOf, listQuery } from './common.js';

export const outboxAttachment = z.object({
  id: z.number().int(),
  filename: z.string(),
  contentType: z.string(),
  sizeBytes: z.number().int(),
});

export const outboxMessage = z.object({
  id: z.number().int(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
  headers: z.record(z.string(), z.string()),
  attachments: z.array(outboxAttachment),
  receivedAt: z.string(),
});
export type OutboxMessageOutput = z.infer<typeof outboxMessage>;

export const outboxListQuery = listQuery(['receivedAt', 'subject'] as const, '-receivedAt').extend({
  q: z.string().trim().max(100).optional(),
});
export const outboxList = listOf(outboxMessage);
