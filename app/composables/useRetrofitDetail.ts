// One retrofit of the Retrofit log with its meter data and verification: loading, changes under
// the version that was read (a stale version reloads and says so), and attachments.
import { ref, shallowRef } from 'vue';
import type { MeterDataOutput, RetrofitDetail, RetrofitFileKind, RetrofitPatch, VerificationOutput } from 'shared/retrofit';
import { ApiError } from 'src/api/client';
import { retrofitsApi } from 'src/api/retrofits';
import { errorMessage } from './useNotify';

/** Why a change was not saved: the sentence to show, and whether someone else saved first (409). */
export interface PatchProblem {
  message: string;
  stale: boolean;
}

export function useRetrofitDetail(id: number) {
  const retrofit = shallowRef<RetrofitDetail | null>(null);
  const loading = ref(false);
  const loadError = ref<string | null>(null);
  const meterData = shallowRef<MeterDataOutput | null>(null);
  const verification = shallowRef<VerificationOutput | null>(null);
  const measuring = ref(false);
  const measureError = ref<string | null>(null);
  const saving = ref(false);

  async function loadRetrofit(): Promise<void> {
    loading.value = true;
    loadError.value = null;
    try {
      retrofit.value = await retrofitsApi.get(id);
    } catch (error) {
      loadError.value = errorMessage(error);
    } finally {
      loading.value = false;
    }
  }

  /** The meter data and the verification computed from them. */
  async function loadMeasured(): Promise<void> {
    measuring.value = true;
    measureError.value = null;
    try {
      [meterData.value, verification.value] = await Promise.all([retrofitsApi.meterData(id), retrofitsApi.verification(id)]);
    } catch (error) {
      measureError.value = errorMessage(error);
    } finally {
      measuring.value = false;
    }
  }

  async function loadAll(): Promise<void> {
    await Promise.all([loadRetrofit(), loadMeasured()]);
  }

  /**
   * A transition and/or data with the version read. Answers null when it worked, else the
   * sentence to show and whether the version was stale (then the retrofit is reloaded first).
   */
  async function patch(body: Omit<RetrofitPatch, 'version'>): Promise<PatchProblem | null> {
    const current = retrofit.value;
    if (!current) return { message: 'The retrofit is not loaded.', stale: false };
    saving.value = true;
    try {
      retrofit.value = await retrofitsApi.update(id, { ...body, version: current.version } as RetrofitPatch);
      // Method, variable and status all change what the verification says.
      void loadMeasured();
      return null;
    } catch (error) {
      if (error instanceof ApiError && error.isStaleVersion) {
        await loadRetrofit();
        return { message: 'Someone changed this retrofit meanwhile; the current version is shown now. Check it and try again.', stale: true };
      }
      return { message: errorMessage(error), stale: false };
    } finally {
      saving.value = false;
    }
  }

  /** Attaches files one after the other; answers the names that failed with why. */
  async function attach(files: Array<{ file: File; kind: RetrofitFileKind }>): Promise<string[]> {
    const failed: string[] = [];
    for (const { file, kind } of files) {
      try {
        await retrofitsApi.uploadFile(id, file, kind);
      } catch (error) {
        failed.push(`${file.name}: ${errorMessage(error)}`);
      }
    }
    if (files.length > 0) await loadRetrofit();
    return failed;
  }

  return { retrofit, loading, loadError, meterData, verification, measuring, measureError, saving, loadRetrofit, loadMeasured, loadAll, patch, attach };
}
