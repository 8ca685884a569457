/**
 * Nameplate photos and documents of a motor. The type is recognised from the content (JPEG, PNG,
 * WebP, PDF only), the bytes are stored under UPLOAD_DIR with a random name, and a download is sent
 * as an attachment with the recognised type and `nosniff`, so no upload can run in the app's origin.
 */
import type { Response } from 'express';
import { database } from '../lib/database.js';
import { notFound } from '../lib/errors.js';
import type { Tenant } from '../lib/tenant.js';
import { attachableType, safeFileName, sendStoredFile, storeThenRecord } from '../lib/uploads.js';
import { Motor, MotorFile } from '../models/index.js';
import type { MotorFileOutput } from '../shared/motor.js';

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
  const allowed: MotorFile['contentType'] = attachableType(upload.buffer, kind === 'nameplate-photo' ? { kindLabel: 'a nameplate photo' } : undefined);
  const file = await storeThenRecord(upload.buffer, (stored) =>
    database().transaction(async (transaction) => {
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
    }),
  );
  return toFileOutput(file);
}

export async function listMotorFiles(tenant: Tenant, motorId: number): Promise<{ items: MotorFileOutput[] }> {
  await tenant.findById(Motor, motorId, 'Motor');
  const files = await tenant.findAll(MotorFile, { where: { motorId }, order: [['createdAt', 'DESC'], ['id', 'DESC']] });
  return { items: files.map(toFileOutput) };
}

export async function sendMotorFile(tenant: Tenant, motorId: number, fileId: number, res: Response): Promise<void> {
  await tenant.findById(Motor, motorId, 'Motor');
  const file = await MotorFile.findOne({ where: tenant.where<MotorFile>({ id: fileId, motorId }) });
  if (!file) throw notFound('File');
  await sendStoredFile(res, file);
}
