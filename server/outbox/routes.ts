import { z } from 'zod';
import { route, type RouteSpec } from '../lib/routing.js';
import { idParams } from '../shared/common.js';
import { outboxList, outboxListQuery, outboxMessage } from '../shared/outbox.js';
import { OUTBOX_READERS } from '../shared/roles.js';
import { getAttachment, getOutboxMessage, listOutbox } from './service.js';

export const outboxRoutes: RouteSpec[] = [
  route({
    method: 'get',
    path: '/outbox',
    summary: 'E-mail caught by the local mail catcher for this organisation',
    tag: 'outbox',
    access: OUTBOX_READERS,
    query: outboxListQuery,
    response: outboxList,
    handler: ({ tenant, query }) => listOutbox(tenant, query),
  }),
  route({
    method: 'get',
    path: '/outbox/:id',
    summary: 'One caught message',
    tag: 'outbox',
    access: OUTBOX_READERS,
    params: idParams,
    response: outboxMessage,
    handler: ({ tenant, params }) => getOutboxMessage(tenant, params.id),
  }),
  route({
    method: 'get',
    path: '/outbox/:id/attachments/:attachmentId',
    summary: 'Download an attachment of a caught message',
    tag: 'outbox',
    access: OUTBOX_READERS,
    params: idParams.extend({ attachmentId: z.coerce.number().int().positive() }),
    produces: 'application/octet-stream',
    handler: async ({ tenant, params, res }) => {
      const attachment = await getAttachment(tenant, params.id, params.attachmentId);
      // Always a download, never rendered in the app's origin.
      res.setHeader('Content-Type', attachment.contentType.includes('/') ? attachment.contentType : 'application/octet-stream');
      res.setHeader('Content-Disposition', `attachment; filename="${attachment.filename.replace(/["\\\r\n]/g, '_')}"`);
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.send(attachment.content);
    },
  }),
];
