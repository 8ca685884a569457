// The one HTTP client of the app: JSON in and out, the CSRF header on state-changing requests,
// same-origin cookies, and one error type. Resource modules (app/api/<resource>.ts) wrap it in typed
// functions; components never call it directly. boot/api.ts wires its 401 hook to the session store
// and the router.
import type { ErrorBody } from 'shared/common';

/** A field-level message the server (or a form) attaches to an error. */
export interface FieldMessage {
  field: string;
  message: string;
}

/** An API failure with the server's stable `code`, its message, `details` and the HTTP status. */
export class ApiError extends Error {
  readonly code: string;
  readonly status: number;
  readonly details: unknown;

  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }

  /**
   * The fields the server named in `details`, in either of its two shapes:
   * `{ field: 'voltageV' }` (the message is the error's own, "voltageV: must be ...") or an array of
   * `{ field, message }`.
   */
  get fieldMessages(): FieldMessage[] {
    const details = this.details;
    if (Array.isArray(details)) {
      return details.flatMap((item: unknown) =>
        isRecord(item) && typeof item.field === 'string'
          ? [{ field: item.field, message: typeof item.message === 'string' ? item.message : this.message }]
          : [],
      );
    }
    if (isRecord(details) && typeof details.field === 'string') {
      const prefix = `${details.field}: `;
      const message = this.message.startsWith(prefix) ? this.message.slice(prefix.length) : this.message;
      return [{ field: details.field, message }];
    }
    return [];
  }

  /** True when the server refused an edit because someone else saved the row first. */
  get isStaleVersion(): boolean {
    return this.status === 409 && this.code === 'stale-version';
  }
}

/** Network failures (server down, offline) become an ApiError with status 0. */
export const NETWORK_ERROR_CODE = 'network';

export type QueryValue = string | number | boolean | undefined | null;

export interface RequestOptions {
  query?: Record<string, QueryValue>;
  body?: unknown;
  /**
   * False for requests whose 401 is an answer, not a lost session (sign-in with a wrong password,
   * "who am I" while signed out): the unauthorised hook is not called.
   */
  auth?: boolean;
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null;
}

function isErrorBody(value: unknown): value is ErrorBody {
  return isRecord(value) && isRecord(value.error) && typeof value.error.code === 'string';
}

/** `?a=1&b=x` from a record, leaving out empty values. */
export function toQueryString(query: Record<string, QueryValue> | undefined): string {
  if (!query) return '';
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === '') continue;
    params.set(key, String(value));
  }
  const text = params.toString();
  return text ? `?${text}` : '';
}

export class ApiClient {
  private csrfToken: string | null = null;
  private unauthorizedHandler: (() => void) | null = null;

  constructor(private readonly baseUrl = '') {}

  /** Remember the token the server handed out (sign-in, `me`, `/api/auth/csrf`). */
  setCsrfToken(token: string | null): void {
    this.csrfToken = token;
  }

  /** Called when a request that needs a session answers 401. */
  onUnauthorized(handler: (() => void) | null): void {
    this.unauthorizedHandler = handler;
  }

  get<T>(path: string, query?: Record<string, QueryValue>): Promise<T> {
    return this.request<T>('GET', path, query ? { query } : {});
  }

  post<T>(path: string, body?: unknown, options: Omit<RequestOptions, 'body'> = {}): Promise<T> {
    return this.request<T>('POST', path, { ...options, body });
  }

  patch<T>(path: string, body: unknown): Promise<T> {
    return this.request<T>('PATCH', path, { body });
  }

  put<T>(path: string, body: unknown): Promise<T> {
    return this.request<T>('PUT', path, { body });
  }

  delete<T = void>(path: string): Promise<T> {
    return this.request<T>('DELETE', path, {});
  }

  /** A URL the browser can open or download directly (attachments). */
  url(path: string): string {
    return `${this.baseUrl}${path}`;
  }

  async request<T>(method: string, path: string, options: RequestOptions = {}): Promise<T> {
    const unsafe = !SAFE_METHODS.has(method);
    if (unsafe && this.csrfToken === null) await this.refreshCsrfToken();

    let response = await this.send(method, path, options);
    // A token can expire with its session; fetch a fresh one and try once more.
    if (unsafe && response.status === 403 && (await peekCode(response))?.toLowerCase().includes('csrf')) {
      await this.refreshCsrfToken();
      response = await this.send(method, path, options);
    }
    return this.read<T>(response, options.auth !== false);
  }

  private async refreshCsrfToken(): Promise<void> {
    const response = await this.send('GET', '/api/auth/csrf', {});
    const body = await this.read<{ token: string }>(response, false);
    this.csrfToken = body.token;
  }

  private async send(method: string, path: string, options: RequestOptions): Promise<Response> {
    const headers: Record<string, string> = { Accept: 'application/json' };
    if (options.body !== undefined) headers['Content-Type'] = 'application/json';
    if (!SAFE_METHODS.has(method) && this.csrfToken) headers['x-csrf-token'] = this.csrfToken;
    const init: RequestInit = { method, headers, credentials: 'same-origin' };
    if (options.body !== undefined) init.body = JSON.stringify(options.body);
    try {
      return await fetch(`${this.baseUrl}${path}${toQueryString(options.query)}`, init);
    } catch {
      throw new ApiError(0, NETWORK_ERROR_CODE, 'The server cannot be reached. Check the connection and try again.');
    }
  }

  private async read<T>(response: Response, callUnauthorized: boolean): Promise<T> {
    if (response.status === 204) return undefined as T;
    const text = await response.text();
    let body: unknown = undefined;
    if (text) {
      try {
        body = JSON.parse(text);
      } catch {
        body = undefined;
      }
    }
    if (response.ok) return body as T;

    if (response.status === 401 && callUnauthorized) this.unauthorizedHandler?.();
    if (isErrorBody(body)) {
      throw new ApiError(response.status, body.error.code, body.error.message, body.error.details);
    }
    throw new ApiError(response.status, `http-${response.status}`, `The server answered ${response.status} ${response.statusText}`.trim());
  }
}

async function peekCode(response: Response): Promise<string | undefined> {
  try {
    const body: unknown = await response.clone().json();
    return isErrorBody(body) ? body.error.code : undefined;
  } catch {
    return undefined;
  }
}

/** The app's one client; same origin (the Express server serves the app and the API). */
export const api = new ApiClient();

/** A list's query parameters as the client sends them: all optional (the server has defaults). */
export type QueryOf<T> = { [K in keyof T]?: T[K] | undefined };
