/**
 * Documents and photos of a retrofit (order confirmation, commissioning sheet, nameplate of the new
 * motor…). As for motors' files (server/motors/files.ts): the type is recognised from the content
 * (JPEG, PNG, WebP, PDF only), the bytes are stored under UPLOAD_DIR with a random name, and a
 * download is an attachment with `nosniff` and a sandboxing CSP.
 */
import type { Response } from 'express';
import { database } from '../lib/database.js';
import { notFound } from '../lib/errors.js';
import type { Tenant } from '../lib/tenant.js';
import { attachableType, safeFileName, sendStoredFile, storeThenRecord } from '../lib/uploads.js';
import { Retrofit, RetrofitFile } from '../models/index.js';
import type { RetrofitFileKind, RetrofitFileOutput } from '../shared/retrofit.js';

/** Largest document or photo [bytes]. */
export const RETROFIT_FILE_MAX_BYTES = 15 * 1024 * 1024;

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
  const allowed: RetrofitFile['contentType'] = attachableType(upload.buffer, kind === 'photo' ? { kindLabel: 'a photo' } : undefined);
  const file = await storeThenRecord(upload.buffer, (stored) =>
    database().transaction(async (transaction) => {
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
    }),
  );
  return toFileOutput(file);
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
  await sendStoredFile(res, file);
}
