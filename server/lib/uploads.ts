/**
 * Uploaded files: received into memory by multer with a size limit, recognised from their first
 * bytes (never from the name or the client's content type), and stored under UPLOAD_DIR — outside
 * the web root — with random names, so no path or name a user chose ever reaches the file system.
 */
import { createHash, randomBytes } from 'node:crypto';
import { mkdir, readFile, rm, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { Request, Response } from 'express';
import multer from 'multer';
import type { z } from 'zod';
import { loadConfig } from './config.js';
import { AppError, badRequest, tooLarge } from './errors.js';

/** Types Statorline recognises from content. */
export type SniffedType =
  | 'image/jpeg'
  | 'image/png'
  | 'image/webp'
  | 'application/pdf'
  /** A ZIP container: .xlsx (and other Office Open XML files). */
  | 'application/zip'
  /** An OLE compound file: legacy .xls. */
  | 'application/x-cfb'
  /** Text without NUL bytes: .csv. */
  | 'text/plain';

const startsWith = (buffer: Buffer, bytes: number[], offset = 0) => bytes.every((byte, index) => buffer[offset + index] === byte);

/** The type of a file from its first bytes (magic numbers), or null when it is none of SniffedType. */
export function sniffType(buffer: Buffer): SniffedType | null {
  if (startsWith(buffer, [0xff, 0xd8, 0xff])) return 'image/jpeg';
  if (startsWith(buffer, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
  if (startsWith(buffer, [0x52, 0x49, 0x46, 0x46]) && startsWith(buffer, [0x57, 0x45, 0x42, 0x50], 8)) return 'image/webp';
  if (startsWith(buffer, [0x25, 0x50, 0x44, 0x46, 0x2d])) return 'application/pdf';
  if (startsWith(buffer, [0x50, 0x4b, 0x03, 0x04])) return 'application/zip';
  if (startsWith(buffer, [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1])) return 'application/x-cfb';
  const head = buffer.subarray(0, 64 * 1024);
  if (head.length > 0 && !head.includes(0) && isMostlyText(head)) return 'text/plain';
  return null;
}

/** Control bytes other than tab, CR, LF and form feed mark a binary file. */
function isMostlyText(head: Buffer): boolean {
  let control = 0;
  for (const byte of head) if (byte < 0x20 && byte !== 0x09 && byte !== 0x0a && byte !== 0x0d && byte !== 0x0c) control += 1;
  return control <= head.length / 1000;
}

let configuredDir: string | undefined;

/** Points storage at another folder (tests and benchmarks use a temporary one). */
export function setUploadDir(dir: string): void {
  configuredDir = dir;
}

function uploadDir(): string {
  configuredDir ??= loadConfig().uploadDir;
  return configuredDir;
}

const KEY_PATTERN = /^[0-9a-f]{2}\/[0-9a-f]{40}$/;

function pathOf(key: string): string {
  if (!KEY_PATTERN.test(key)) throw new AppError('internal', 'A stored file key is malformed.', 500);
  return join(uploadDir(), key);
}

export interface StoredFile {
  /** Random name relative to UPLOAD_DIR (`ab/…40 hex…`). */
  key: string;
  sha256: string;
  sizeBytes: number;
}

/** Writes the bytes under a fresh random name, readable by the server's user only. */
export async function storeFile(content: Buffer): Promise<StoredFile> {
  const name = randomBytes(20).toString('hex');
  const key = `${name.slice(0, 2)}/${name}`;
  await mkdir(join(uploadDir(), name.slice(0, 2)), { recursive: true, mode: 0o700 });
  await writeFile(pathOf(key), content, { mode: 0o600, flag: 'wx' });
  return { key, sha256: createHash('sha256').update(content).digest('hex'), sizeBytes: content.length };
}

export function readStoredFile(key: string): Promise<Buffer> {
  return readFile(pathOf(key));
}

export async function removeStoredFile(key: string): Promise<void> {
  await rm(pathOf(key), { force: true });
}

/**
 * Receives one multipart file (field `file`) into memory, within `maxBytes`, and the form's text
 * fields; a too-large file is a 413 and a missing one a 400 naming the field.
 */
export async function receiveFile(req: Request, res: Response, maxBytes: number): Promise<{ file: Express.Multer.File; fields: Record<string, unknown> }> {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: 20, fieldSize: 200_000, parts: 25 },
  }).single('file');
  await new Promise<void>((resolve, reject) => {
    upload(req, res, (error: unknown) => {
      if (!error) return resolve();
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') return reject(tooLarge(`The file is larger than ${Math.round(maxBytes / 1024 / 1024)} MB.`));
        return reject(badRequest(`file: ${error.message}`, [{ field: error.field ?? 'file', message: error.message }]));
      }
      reject(error instanceof Error && /Multipart|Boundary/i.test(error.message) ? badRequest('Send the file as multipart/form-data in the field "file".') : error);
    });
  });
  if (!req.file) throw badRequest('file: is required (multipart/form-data, field "file")', [{ field: 'file', message: 'is required' }]);
  return { file: req.file, fields: (req.body ?? {}) as Record<string, unknown> };
}

/** Validates the text fields of a multipart form with the same error shape as the route declarations. */
export function parseFormFields<S extends z.ZodType>(schema: S, fields: Record<string, unknown>): z.infer<S> {
  const result = schema.safeParse(fields);
  if (result.success) return result.data;
  const details = result.error.issues.map((issue) => ({ field: issue.path.length > 0 ? issue.path.join('.') : 'body', message: issue.message }));
  throw badRequest(`${details[0]?.field ?? 'body'}: ${details[0]?.message ?? 'is invalid'}`, details);
}

/** A file name safe to put in Content-Disposition and to show: no path, no control characters. */
export function safeFileName(name: string, fallback = 'file'): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  // eslint-disable-next-line no-control-regex
  const cleaned = base.replace(/[\u0000-\u001f\u007f"]/g, '').trim().slice(0, 200);
  return cleaned === '' ? fallback : cleaned;
}

/** `attachment; filename="…"; filename*=UTF-8''…` for a download. */
export function attachmentHeader(name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}

/** The file types a motor or a retrofit may carry: photos and PDF documents. */
export const ATTACHABLE_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'application/pdf'] as const;
export type AttachableType = (typeof ATTACHABLE_TYPES)[number];

/**
 * The type of an uploaded attachment, recognised from its bytes (never from its name): 415 for
 * anything but an image or a PDF, 400 when `imageOnly` names a kind that must be a picture.
 */
export function attachableType(buffer: Buffer, imageOnly?: { kindLabel: string }): AttachableType {
  const type = sniffType(buffer);
  if (!(ATTACHABLE_TYPES as readonly string[]).includes(type ?? '')) {
    throw new AppError('unsupported-file', 'file: only JPEG, PNG or WebP images and PDF documents can be attached', 415, [
      { field: 'file', message: 'must be an image or a PDF' },
    ]);
  }
  if (imageOnly && type === 'application/pdf') {
    throw new AppError('invalid-input', `file: ${imageOnly.kindLabel} must be an image`, 400, [{ field: 'file', message: 'must be an image' }]);
  }
  return type as AttachableType;
}

/** Stores the bytes, then records them with `record`; if recording fails the stored bytes are removed. */
export async function storeThenRecord<T>(content: Buffer, record: (stored: StoredFile) => Promise<T>): Promise<T> {
  const stored = await storeFile(content);
  try {
    return await record(stored);
  } catch (error) {
    await removeStoredFile(stored.key);
    throw error;
  }
}

/** Sends a stored upload as a download that cannot run in the app's origin. */
export async function sendStoredFile(res: Response, file: { storageKey: string; contentType: string; fileName: string }): Promise<void> {
  const content = await readStoredFile(file.storageKey);
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', attachmentHeader(file.fileName));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
  res.setHeader('Cache-Control', 'private, no-store');
  res.status(200).end(content);
}
