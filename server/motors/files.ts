/**
 * Nameplate photos and documents of a motor. The type is recognised from the content (JPEG, PNG,
 * WebP, PDF only), the bytes are stored under UPLOAD_DIR with a random name, and a download is sent
 * as an attachment with the recognised type and `nosniff`, so no upload can run in the app's origin.
 */
import type { Response } from 'express';
import { database } from '../lib/database.js';
import { AppError } from '../lib/errors.js';
import type { Tenant } from '../lib/tenant.js';
import { attachmentHeader, readStoredFile, removeStoredFile, safeFileName, sniffType, storeFile } from '../lib/uploads.js';
import { Motor, MotorFile } from '../models/index.js';
import { MOTOR_FILE_TYPES, type MotorFileOutput } from '../shared/motor.js';

function toFileOutput(file: MotorFile): MotorFileOutput {
  return {
    id: file.id,
    motorId: file.motorId,
    kind: file.kind,
    fileName: file.fileName,
    contentType: file.contentType,
    sizeBytes: file.sizeBytes,
    userId: file.userId,
    createdAt: file.createdAt.toISOString(),
  };
}

export async function addMotorFile(
  tenant: Tenant,
  motorId: number,
  upload: { buffer: Buffer; originalname: string },
  kind: MotorFile['kind'],
): Promise<MotorFileOutput> {
  await tenant.findById(Motor, motorId, 'Motor');
  const type = sniffType(upload.buffer);
  const allowed = (MOTOR_FILE_TYPES as readonly string[]).includes(type ?? '') ? (type as MotorFile['contentType']) : undefined;
  if (!allowed) throw new AppError('unsupported-file', 'file: only JPEG, PNG or WebP images and PDF documents can be attached', 415, [{ field: 'file', message: 'must be an image or a PDF' }]);
  if (kind === 'nameplate-photo' && allowed === 'application/pdf') {
    throw new AppError('invalid-input', 'file: a nameplate photo must be an image', 400, [{ field: 'file', message: 'must be an image' }]);
  }
  const stored = await storeFile(upload.buffer);
  try {
    const file = await database().transaction(async (transaction) => {
      const created = await tenant.create(
        MotorFile,
        {
          motorId,
          kind,
          fileName: safeFileName(upload.originalname, kind === 'nameplate-photo' ? 'nameplate' : 'document'),
          contentType: allowed,
          sizeBytes: stored.sizeBytes,
          storageKey: stored.key,
          sha256: stored.sha256,
          userId: tenant.user.id,
        },
        transaction,
      );
      await tenant.audit('add-file', 'motor', motorId, { fileId: created.id, kind, fileName: created.fileName, sizeBytes: created.sizeBytes }, transaction);
      return created;
    });
    return toFileOutput(file);
  } catch (error) {
    await removeStoredFile(stored.key);
    throw error;
  }
}

export async function listMotorFiles(tenant: Tenant, motorId: number): Promise<{ items: MotorFileOutput[] }> {
  await tenant.findById(Motor, motorId, 'Motor');
  const files = await tenant.findAll(MotorFile, { where: { motorId }, order: [['createdAt', 'DESC'], ['id', 'DESC']] });
  return { items: files.map(toFileOutput) };
}

export async function sendMotorFile(tenant: Tenant, motorId: number, fileId: number, res: Response): Promise<void> {
  await tenant.findById(Motor, motorId, 'Motor');
  const file = await MotorFile.findOne({ where: tenant.where<MotorFile>({ id: fileId, motorId }) });
  if (!file) throw new AppError('not-found', 'File was not found.', 404);
  const content = await readStoredFile(file.storageKey);
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', attachmentHeader(file.fileName));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
  res.setHeader('Cache-Control', 'private, no-store');
  res.status(200).end(content);
}
