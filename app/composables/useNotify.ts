// One way to tell the user that something worked or failed (Quasar Notify).
import { useQuasar } from 'quasar';
import { ApiError } from 'src/api/client';

/** A sentence for an error, whatever threw it. */
export function errorMessage(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.status === 403) return 'Your role does not allow this.';
    if (error.status === 404) return 'Not found: it may have been removed, or it belongs to another organisation.';
    return error.message;
  }
  return error instanceof Error ? error.message : String(error);
}

export function useNotify() {
  const $q = useQuasar();

  function notifyError(error: unknown, context?: string): void {
    const message = errorMessage(error);
    $q.notify({ type: 'negative', message: context ? `${context}: ${message}` : message, position: 'top-right' });
  }

  function notifySuccess(message: string): void {
    $q.notify({ type: 'positive', message, position: 'top-right', timeout: 2500 });
  }

  return { notifyError, notifySuccess };
}
