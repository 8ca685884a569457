import { vi } from 'vitest';

/** One upload as the fake saw it. */
export interface SentUpload {
  url: string;
  headers: Record<string, string>;
  form: FormData;
}

/**
 * Replaces the global XMLHttpRequest (uploads go through XHR for progress) with one that answers every
 * send with the status and body `answer` gives, after reporting half the upload done.
 * Returns the uploads sent, in order; `vi.unstubAllGlobals()` restores the real one.
 */
export function stubXhr(answer: (form: FormData, url: string) => { status: number; body: unknown }): SentUpload[] {
  const sent: SentUpload[] = [];
  class FakeXhr {
    status = 0;
    statusText = '';
    responseText = '';
    withCredentials = false;
    upload: { onprogress: ((event: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
    onload: (() => void) | null = null;
    onerror: (() => void) | null = null;
    onabort: (() => void) | null = null;
    private url = '';
    private headers: Record<string, string> = {};
    open(_method: string, url: string) {
      this.url = url;
    }
    setRequestHeader(name: string, value: string) {
      this.headers[name] = value;
    }
    abort() {
      this.onabort?.();
    }
    send(form: FormData) {
      sent.push({ url: this.url, headers: this.headers, form });
      const { status, body } = answer(form, this.url);
      setTimeout(() => {
        this.upload.onprogress?.({ lengthComputable: true, loaded: 50, total: 100 });
        this.status = status;
        this.responseText = JSON.stringify(body);
        this.onload?.();
      }, 0);
    }
  }
  vi.stubGlobal('XMLHttpRequest', FakeXhr);
  return sent;
}
