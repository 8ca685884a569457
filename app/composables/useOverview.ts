// The Overview figures of the signed-in user's organisation.
import { ref, shallowRef } from 'vue';
import type { OverviewResponse } from 'shared/overview';
import { ApiError } from 'src/api/client';
import { overviewApi } from 'src/api/overview';

export function useOverview() {
  const overview = shallowRef<OverviewResponse | null>(null);
  const loading = ref(false);
  const error = shallowRef<ApiError | null>(null);

  async function load(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      overview.value = await overviewApi.get();
    } catch (caught) {
      error.value = caught instanceof ApiError ? caught : new ApiError(0, 'client', String(caught));
    } finally {
      loading.value = false;
    }
  }

  return { overview, loading, error, load };
}
