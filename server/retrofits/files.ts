/**
 * Documents and photos of a retrofit (order confirmation, commissioning sheet, nameplate of the new
 * motor…). As for motors' files (server/motors/files.ts): the type is recognised from the content
 * (JPEG, PNG, WebP, PDF only), the bytes are stored under UPLOAD_DIR with a random name, and a
 * download is an attachment with `nosniff` and a sandboxing CSP.
 */
import type { Response } from 'express';
import { database } from '../lib/database.js';
import { AppError, notFound } from '../lib/errors.js';
import type { Tenant } from '../lib/tenant.js';
import { attachmentHeader, readStoredFile, removeStoredFile, safeFileName, sniffType, storeFile } from '../lib/uploads.js';
import { Retrofit, RetrofitFile } from '../models/index.js';
import type { RetrofitFileKind, RetrofitFileOutput } from '../shared/retrofit.js';

/** Largest document or photo [bytes]. */
export const RETROFIT_FILE_MAX_BYTES = 15 * 1024 * 1024;
const ALLOWED = ['image/jpeg', 'image/png', 'image/webp', 'application/pdf'] as const;

export function toFileOutput(file: RetrofitFile): RetrofitFileOutput {
  return {
    id: file.id,
    retrofitId: file.retrofitId,
    kind: file.kind,
    fileName: file.fileName,
    contentType: file.contentType,
    sizeBytes: file.sizeBytes,
    userId: file.userId,
    createdAt: file.createdAt.toISOString(),
  };
}

export async function addRetrofitFile(tenant: Tenant, retrofitId: number, upload: { buffer: Buffer; originalname: string }, kind: RetrofitFileKind): Promise<RetrofitFileOutput> {
  await tenant.findById(Retrofit, retrofitId, 'Retrofit');
  const type = sniffType(upload.buffer);
  const allowed = (ALLOWED as readonly string[]).includes(type ?? '') ? (type as RetrofitFile['contentType']) : undefined;
  if (!allowed) throw new AppError('unsupported-file', 'file: only JPEG, PNG or WebP images and PDF documents can be attached', 415, [{ field: 'file', message: 'must be an image or a PDF' }]);
  if (kind === 'photo' && allowed === 'application/pdf') throw new AppError('invalid-input', 'file: a photo must be an image', 400, [{ field: 'file', message: 'must be an image' }]);
  const stored = await storeFile(upload.buffer);
  try {
    const file = await database().transaction(async (transaction) => {
      const created = await tenant.create(
        RetrofitFile,
        {
          retrofitId,
          kind,
          fileName: safeFileName(upload.originalname, kind),
          contentType: allowed,
          sizeBytes: stored.sizeBytes,
          storageKey: stored.key,
          sha256: stored.sha256,
          userId: tenant.user.id,
        },
        transaction,
      );
      await tenant.audit('add-file', 'retrofit', retrofitId, { fileId: created.id, kind, fileName: created.fileName, sizeBytes: created.sizeBytes }, transaction);
      return created;
    });
    return toFileOutput(file);
  } catch (error) {
    await removeStoredFile(stored.key);
    throw error;
  }
}

export async function listRetrofitFiles(tenant: Tenant, retrofitId: number): Promise<{ items: RetrofitFileOutput[] }> {
  await tenant.findById(Retrofit, retrofitId, 'Retrofit');
  const files = await tenant.findAll(RetrofitFile, { where: { retrofitId }, order: [['createdAt', 'DESC'], ['id', 'DESC']] });
  return { items: files.map(toFileOutput) };
}

export async function sendRetrofitFile(tenant: Tenant, retrofitId: number, fileId: number, res: Response): Promise<void> {
  await tenant.findById(Retrofit, retrofitId, 'Retrofit');
  const file = await RetrofitFile.findOne({ where: tenant.where<RetrofitFile>({ id: fileId, retrofitId }) });
  if (!file) throw notFound('File');
  const content = await readStoredFile(file.storageKey);
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', attachmentHeader(file.fileName));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
  res.setHeader('Cache-Control', 'private, no-store');
  res.status(200).end(content);
}
