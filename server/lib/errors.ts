/**
 * The one error kind services throw. The error middleware turns it into
 * `{ error: { code, message, details } }` with `status`.
 */
export class AppError extends Error {
  constructor(
    readonly code: string,
    message: string,
    readonly status: number,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const badRequest = (message: string, details?: unknown) => new AppError('invalid-input', message, 400, details);
export const notSignedIn = () => new AppError('not-signed-in', 'Sign in to continue.', 401);
export const forbidden = (message = 'Your role does not allow this.') => new AppError('forbidden', message, 403);
export const notFound = (what: string) => new AppError('not-found', `${what} was not found.`, 404);
export const staleVersion = (what: string) =>
  new AppError(
    'stale-version',
    `${what} was changed by someone else since you opened it. Reload it to see their changes, then apply yours again.`,
    409,
  );
export const conflict = (code: string, message: string, details?: unknown) => new AppError(code, message, 409, details);
export const tooLarge = (message: string) => new AppError('too-large', message, 413);
export const tooManyAttempts = (message: string, retryAfterSeconds?: number) =>
  new AppError('too-many-attempts', message, 429, retryAfterSeconds === undefined ? undefined : { retryAfterSeconds });
export const unavailable = (message: string) => new AppError('unavailable', message, 503);
