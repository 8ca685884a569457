// The Outbox: caught e-mail, newest first, with a text filter, and the message being read.
import { ref, shallowRef, watch } from 'vue';
import type { OutboxMessageOutput } from 'shared/outbox';
import { ApiError } from 'src/api/client';
import { outboxApi } from 'src/api/outbox';
import { usePagedTable } from './usePagedTable';

export function useOutbox() {
  const search = ref('');
  const table = usePagedTable<OutboxMessageOutput>(
    (request) => outboxApi.list({ ...request, q: search.value.trim() || undefined }),
    { sortBy: 'receivedAt', descending: true },
  );
  watch(search, () => void table.reload(true));

  const message = shallowRef<OutboxMessageOutput | null>(null);
  const messageLoading = ref(false);
  const messageError = shallowRef<ApiError | null>(null);

  /** Show a message: from the loaded page when it is there, else from the server. */
  async function open(id: number | null): Promise<void> {
    messageError.value = null;
    if (id === null) {
      message.value = null;
      return;
    }
    const inPage = table.rows.value.find((row) => row.id === id);
    if (inPage) {
      message.value = inPage;
      return;
    }
    messageLoading.value = true;
    try {
      message.value = await outboxApi.get(id);
    } catch (error) {
      message.value = null;
      messageError.value = error instanceof ApiError ? error : new ApiError(0, 'client', String(error));
    } finally {
      messageLoading.value = false;
    }
  }

  return { ...table, search, message, messageLoading, messageError, open, attachmentUrl: outboxApi.attachmentUrl };
}
