/** The Outbox: e-mail caught by the local fake SMTP server, shown per organisation. */
import type { z } from 'zod';
import { Op, type WhereOptions } from 'sequelize';
import { OutboxAttachment, OutboxMessage } from '../models/index.js';
import { notFound } from '../lib/errors.js';
import { orderFrom, pageWindow } from '../lib/lists.js';
import type { Tenant } from '../lib/tenant.js';
import type { ListResult } from '../shared/common.js';
import type { outboxListQuery, OutboxMessageOutput } from '../shared/outbox.js';

const ATTACHMENT_FIELDS = ['id', 'filename', 'contentType', 'sizeBytes'] as const;

function toOutput(message: OutboxMessage & { attachments?: OutboxAttachment[] }): OutboxMessageOutput {
  return {
    id: message.id,
    from: message.fromAddress,
    to: message.toAddresses,
    subject: message.subject,
    text: message.textBody,
    html: message.htmlBody,
    headers: message.headers,
    attachments: (message.attachments ?? []).map((a) => ({ id: a.id, filename: a.filename, contentType: a.contentType, sizeBytes: a.sizeBytes })),
    receivedAt: message.receivedAt.toISOString(),
  };
}

const withAttachments = { model: OutboxAttachment, as: 'attachments', attributes: [...ATTACHMENT_FIELDS] };

export async function listOutbox(tenant: Tenant, query: z.infer<typeof outboxListQuery>): Promise<ListResult<OutboxMessageOutput>> {
  const where: WhereOptions<OutboxMessage> = {};
  if (query.q) {
    const pattern = `%${query.q.replace(/[%_\\]/g, '\\$&')}%`;
    Object.assign(where, { [Op.or]: [{ subject: { [Op.iLike]: pattern } }, { textBody: { [Op.iLike]: pattern } }] });
  }
  const { rows, count } = await tenant.findAndCountAll(OutboxMessage, {
    where,
    include: [withAttachments],
    order: orderFrom(query.sort),
    distinct: true,
    ...pageWindow(query.page, query.pageSize),
  });
  return { items: rows.map(toOutput), total: count, page: query.page, pageSize: query.pageSize };
}

export async function getOutboxMessage(tenant: Tenant, id: number): Promise<OutboxMessageOutput> {
  return toOutput(await tenant.findById(OutboxMessage, id, 'Message', { include: [withAttachments] }));
}

export async function getAttachment(tenant: Tenant, messageId: number, attachmentId: number): Promise<OutboxAttachment> {
  await tenant.findById(OutboxMessage, messageId, 'Message');
  const attachment = await OutboxAttachment.findOne({ where: { id: attachmentId, messageId } });
  if (!attachment) throw notFound('Attachment');
  return attachment;
}
