// The organisation's settings as the Settings pages read them (`GET /api/settings`).
import { ref, shallowRef } from 'vue';
import type { SettingsOutput } from 'shared/settings';
import { errorMessage } from 'composables/useNotify';
import { settingsApi } from 'src/api/settings';

export function useSettings() {
  const settings = shallowRef<SettingsOutput | null>(null);
  const loading = ref(false);
  const loadError = ref<string | null>(null);

  async function load(): Promise<SettingsOutput | null> {
    loading.value = true;
    loadError.value = null;
    try {
      settings.value = await settingsApi.get();
      return settings.value;
    } catch (error) {
      loadError.value = errorMessage(error);
      return null;
    } finally {
      loading.value = false;
    }
  }

  return { settings, loading, loadError, load };
}
