// File transfers the JSON client does not cover: multipart uploads with progress (XMLHttpRequest,
// because fetch reports no upload progress) and downloads of attachments as blobs. Both use the
// same session cookie, the same CSRF token and the same ApiError as src/api/client.ts.
import { api, ApiError, NETWORK_ERROR_CODE, toQueryString, type QueryValue } from './client';

export interface UploadOptions {
  /** Called with 0–1 as the bytes leave the browser. */
  onProgress?: (fraction: number) => void;
  /** Aborts the upload (the promise rejects with an ApiError of code 'aborted'). */
  signal?: AbortSignal;
}

let csrfToken: string | null = null;

/** The session's CSRF token (stable for the session), asked once. */
async function token(fresh = false): Promise<string> {
  if (fresh || csrfToken === null) csrfToken = (await api.get<{ token: string }>('/api/auth/csrf')).token;
  return csrfToken;
}

/** Forget the cached token (sign-out). */
export function forgetUploadToken(): void {
  csrfToken = null;
}

function errorFrom(status: number, statusText: string, text: string): ApiError {
  try {
    const body = JSON.parse(text) as { error?: { code?: unknown; message?: unknown; details?: unknown } };
    if (body.error && typeof body.error.code === 'string' && typeof body.error.message === 'string') {
      return new ApiError(status, body.error.code, body.error.message, body.error.details);
    }
  } catch {
    // Not JSON (a proxy's page): fall through to the status line.
  }
  if (status === 413) return new ApiError(413, 'too-large', 'The file is too large for the server.');
  return new ApiError(status, `http-${status}`, `The server answered ${status} ${statusText}`.trim());
}

function sendMultipart<T>(method: string, path: string, form: FormData, csrf: string, options: UploadOptions): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const request = new XMLHttpRequest();
    request.open(method, api.url(path));
    request.withCredentials = true;
    request.setRequestHeader('Accept', 'application/json');
    request.setRequestHeader('x-csrf-token', csrf);
    request.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) options.onProgress?.(event.loaded / event.total);
    };
    request.onload = () => {
      if (request.status >= 200 && request.status < 300) {
        options.onProgress?.(1);
        try {
          resolve((request.responseText ? JSON.parse(request.responseText) : undefined) as T);
        } catch {
          reject(new ApiError(request.status, 'bad-answer', 'The server answered something that is not JSON.'));
        }
      } else {
        reject(errorFrom(request.status, request.statusText, request.responseText));
      }
    };
    request.onerror = () => reject(new ApiError(0, NETWORK_ERROR_CODE, 'The server cannot be reached. Check the connection and try again.'));
    request.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was cancelled.'));
    options.signal?.addEventListener('abort', () => request.abort(), { once: true });
    request.send(form);
  });
}

/**
 * POST a multipart form (a `file` and text fields) with upload progress; answers the JSON body.
 * A refused CSRF token (expired session token) is fetched again and the upload tried once more.
 */
export async function uploadForm<T>(path: string, form: FormData, options: UploadOptions = {}): Promise<T> {
  try {
    return await sendMultipart<T>('POST', path, form, await token(), options);
  } catch (error) {
    if (error instanceof ApiError && error.status === 403 && error.code.toLowerCase().includes('csrf')) {
      return sendMultipart<T>('POST', path, form, await token(true), options);
    }
    throw error;
  }
}

/** The file name of a Content-Disposition header (RFC 6266 `filename*` first). */
export function fileNameFrom(disposition: string | null, fallback: string): string {
  if (!disposition) return fallback;
  const extended = /filename\*\s*=\s*UTF-8''([^;]+)/i.exec(disposition);
  if (extended?.[1]) {
    try {
      return decodeURIComponent(extended[1].trim());
    } catch {
      // Malformed escape: try the plain name.
    }
  }
  const plain = /filename\s*=\s*"?([^";]+)"?/i.exec(disposition);
  return plain?.[1]?.trim() || fallback;
}

export interface DownloadedFile {
  blob: Blob;
  fileName: string;
}

/** GET an attachment as a blob (errors as ApiError, so a 413 "narrow the filter" reads well). */
export async function downloadFile(path: string, query: Record<string, QueryValue | QueryValue[]> = {}, fallbackName = 'download'): Promise<DownloadedFile> {
  let response: Response;
  try {
    response = await fetch(api.url(`${path}${listQueryString(query)}`), { credentials: 'same-origin' });
  } catch {
    throw new ApiError(0, NETWORK_ERROR_CODE, 'The server cannot be reached. Check the connection and try again.');
  }
  if (!response.ok) throw errorFrom(response.status, response.statusText, await response.text());
  return { blob: await response.blob(), fileName: fileNameFrom(response.headers.get('Content-Disposition'), fallbackName) };
}

/** Hand a blob to the browser as a download. */
export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.rel = 'noopener';
  document.body.appendChild(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** Like toQueryString, with list values sent comma-separated (the API's one-or-many filters). */
export function listQueryString(query: Record<string, QueryValue | QueryValue[]>): string {
  const flat: Record<string, QueryValue> = {};
  for (const [key, value] of Object.entries(query)) {
    if (Array.isArray(value)) {
      const items = value.filter((item) => item !== undefined && item !== null && item !== '');
      if (items.length > 0) flat[key] = items.join(',');
    } else flat[key] = value;
  }
  return toQueryString(flat);
}
