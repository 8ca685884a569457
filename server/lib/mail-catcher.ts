/**
 * The local fake SMTP server: accepts every message on loopback (no relay, no delivery) and stores
 * it, with its attachments, in the Outbox tables. Started with the app when SMTP_URL is not set.
 */
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { OutboxAttachment, OutboxMessage } from '../models/index.js';
import { database } from './database.js';
import { logger } from './logger.js';
import { ORGANIZATION_HEADER } from './mail.js';

const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list.flatMap((entry) => entry.value.map((address) => address.address ?? '')).filter(Boolean);
}

async function store(raw: Buffer): Promise<void> {
  const parsed = await simpleParser(raw);
  const headers: Record<string, string> = {};
  for (const line of parsed.headerLines) headers[line.key] = line.line.slice(line.key.length + 1).trim();
  const organizationHeader = headers[ORGANIZATION_HEADER.toLowerCase()];
  const organizationId = organizationHeader && /^\d+$/.test(organizationHeader) ? Number(organizationHeader) : null;
  await database().transaction(async (transaction) => {
    const message = await OutboxMessage.create(
      {
        organizationId,
        messageId: parsed.messageId ?? null,
        fromAddress: parsed.from?.text ?? '',
        toAddresses: addresses(parsed.to),
        subject: parsed.subject ?? '(no subject)',
        textBody: parsed.text ?? '',
        htmlBody: typeof parsed.html === 'string' ? parsed.html : null,
        headers,
        receivedAt: new Date(),
      },
      { transaction },
    );
    for (const attachment of parsed.attachments) {
      await OutboxAttachment.create(
        {
          messageId: message.id,
          filename: attachment.filename ?? 'attachment',
          contentType: attachment.contentType,
          sizeBytes: attachment.size,
          content: attachment.content,
        },
        { transaction },
      );
    }
  });
}

export interface MailCatcher {
  port: number;
  close(): Promise<void>;
}

export function startMailCatcher(port: number): Promise<MailCatcher> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    banner: 'Statorline local mail catcher: nothing is delivered',
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        store(Buffer.concat(chunks))
          .then(() => callback())
          .catch((error: Error) => {
            logger.error('mail catcher could not store a message', { error: error.message });
            callback(error);
          });
      });
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      const address = server.server.address() as AddressInfo;
      resolve({
        port: address.port,
        close: () => new Promise((done) => server.close(() => done())),
      });
    });
  });
}
