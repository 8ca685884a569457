import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiClient, ApiError, toQueryString } from 'src/api/client';
import { fakeFetch } from './mount';

afterEach(() => vi.unstubAllGlobals());

describe('ApiClient', () => {
  it('fetches a CSRF token before the first state-changing request and sends it', async () => {
    const { calls } = fakeFetch({
      'GET /api/auth/csrf': { body: { token: 'fresh' } },
      'POST /api/sites': { status: 201, body: { id: 1 } },
    });
    const client = new ApiClient();
    await expect(client.post('/api/sites', { name: 'Dairy' })).resolves.toEqual({ id: 1 });
    expect(calls.map((call) => `${call.method} ${call.url.pathname}`)).toEqual(['GET /api/auth/csrf', 'POST /api/sites']);
    const headers = new Headers(calls[1]?.init.headers);
    expect(headers.get('x-csrf-token')).toBe('fresh');
    expect(headers.get('content-type')).toBe('application/json');
    expect(calls[1]?.init.credentials).toBe('same-origin');
  });

  it('sends no CSRF header on reads', async () => {
    const { calls } = fakeFetch({ 'GET /api/sites': { body: { items: [], total: 0, page: 1, pageSize: 25 } } });
    const client = new ApiClient();
    client.setCsrfToken('t');
    await client.get('/api/sites', { page: 2, q: '', archived: 'only', sort: undefined });
    expect(new Headers(calls[0]?.init.headers).has('x-csrf-token')).toBe(false);
    expect(calls[0]?.url.search).toBe('?page=2&archived=only');
  });

  it('retries once with a new token when the server refuses the old one', async () => {
    let attempts = 0;
    const { calls } = fakeFetch({
      'GET /api/auth/csrf': { body: { token: 'renewed' } },
      'PATCH /api/sites/4': () =>
        ++attempts === 1
          ? { status: 403, body: { error: { code: 'csrf', message: 'The request has no valid CSRF token' } } }
          : { body: { id: 4 } },
    });
    const client = new ApiClient();
    client.setCsrfToken('expired');
    await expect(client.patch('/api/sites/4', { version: 1 })).resolves.toEqual({ id: 4 });
    expect(new Headers(calls.at(-1)?.init.headers).get('x-csrf-token')).toBe('renewed');
  });

  it('turns the error body into an ApiError naming the fields', async () => {
    fakeFetch({
      'PATCH /api/sites/4': {
        status: 400,
        body: { error: { code: 'invalid-input', message: 'voltageV: must be at least 100 V', details: { field: 'voltageV' } } },
      },
    });
    const client = new ApiClient();
    client.setCsrfToken('t');
    const error = await client.patch('/api/sites/4', { voltageV: 5, version: 1 }).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 400, code: 'invalid-input' });
    expect((error as ApiError).fieldMessages).toEqual([{ field: 'voltageV', message: 'must be at least 100 V' }]);
  });

  it('reads a list of field messages too, and recognises a stale version', async () => {
    const listed = new ApiError(400, 'invalid-input', 'Invalid', [{ field: 'currency', message: 'must be a three-letter ISO 4217 code' }]);
    expect(listed.fieldMessages).toEqual([{ field: 'currency', message: 'must be a three-letter ISO 4217 code' }]);
    expect(new ApiError(409, 'stale-version', 'changed').isStaleVersion).toBe(true);
    expect(new ApiError(409, 'email-taken', 'taken').isStaleVersion).toBe(false);
  });

  it('reports a lost session to its hook, except for calls that expect 401', async () => {
    fakeFetch({
      'GET /api/overview': { status: 401, body: { error: { code: 'not-signed-in', message: 'Sign in to continue.' } } },
      'GET /api/auth/me': { status: 401, body: { error: { code: 'not-signed-in', message: 'Sign in to continue.' } } },
    });
    const client = new ApiClient();
    const hook = vi.fn();
    client.onUnauthorized(hook);
    await expect(client.get('/api/overview')).rejects.toMatchObject({ status: 401 });
    expect(hook).toHaveBeenCalledTimes(1);
    await expect(client.request('GET', '/api/auth/me', { auth: false })).rejects.toMatchObject({ status: 401 });
    expect(hook).toHaveBeenCalledTimes(1);
  });

  it('says so when the server cannot be reached', async () => {
    vi.stubGlobal('fetch', vi.fn(() => Promise.reject(new TypeError('Failed to fetch'))));
    await expect(new ApiClient().get('/api/health')).rejects.toMatchObject({ status: 0, code: 'network' });
  });

  it('leaves empty query values out', () => {
    expect(toQueryString({ a: 1, b: undefined, c: null, d: '', e: false })).toBe('?a=1&e=false');
    expect(toQueryString({})).toBe('');
  });
});
