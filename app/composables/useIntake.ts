// Intake: upload a motor list, map its columns, check every row, commit, and see what happened. The
// batch being worked on lives in the address (`?batch=ID`), so a reload, a second tab or a link to
// a colleague resumes from the server's state; while the server parses or commits, the page polls.
import { computed, onBeforeUnmount, ref, shallowRef, watch } from 'vue';
import { useRoute, useRouter } from 'vue-router';
import type { ListResult } from 'shared/common';
import type { ImportBatchSummary, ImportCommitResult, ImportDetail, ImportMapping, ImportPreviewResult } from 'shared/intake';
import { importsApi, type ImportRowFilter } from 'src/api/imports';
import { ApiError } from 'src/api/client';
import { saveBlob } from 'src/api/transfer';

export type IntakeStep = 'file' | 'mapping' | 'preview' | 'commit';

/** Statuses during which the server is still working on the batch. */
export const BUSY_STATUSES = ['parsing', 'committing'] as const;
export const POLL_INTERVAL_MS = 700;
export const PREVIEW_PAGE_SIZE = 25;
export const ACCEPTED_FILES = '.xlsx,.xls,.csv';

export function isBusy(status: string | undefined): boolean {
  return status !== undefined && (BUSY_STATUSES as readonly string[]).includes(status);
}

/** The step a batch in this status resumes at. */
export function stepFor(status: ImportBatchSummary['status']): IntakeStep {
  if (status === 'previewed' || status === 'failed') return 'preview';
  return 'commit';
}

/** The commit's outcome as counts, from the commit's answer or (after a reload) from the batch. */
export function resultOf(batch: ImportBatchSummary): ImportCommitResult {
  return { created: batch.createdCount, updated: batch.updatedCount, skipped: batch.rows.invalid };
}

/** Headers mapped to the same field: only one column can feed a field. */
export function doubleMapped(mapping: ImportMapping): Record<string, string[]> {
  const byField: Record<string, string[]> = {};
  for (const [header, field] of Object.entries(mapping)) {
    if (field) (byField[field] ??= []).push(header);
  }
  return Object.fromEntries(Object.entries(byField).filter(([, headers]) => headers.length > 1));
}

function sameMapping(a: ImportMapping, b: ImportMapping): boolean {
  const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
  for (const key of keys) if ((a[key] ?? null) !== (b[key] ?? null)) return false;
  return true;
}

function batchIdFrom(value: unknown): number | null {
  const text = Array.isArray(value) ? value[0] : value;
  const id = Number(text);
  return typeof text === 'string' && Number.isInteger(id) && id > 0 ? id : null;
}

export function useIntake() {
  const route = useRoute();
  const router = useRouter();

  const step = ref<IntakeStep>('file');
  const siteId = ref<number | null>(null);
  const file = shallowRef<File | null>(null);
  const uploadProgress = ref<number | null>(null);
  const uploadError = shallowRef<ApiError | null>(null);

  const batch = shallowRef<ImportDetail | null>(null);
  const loadingBatch = ref(false);
  const batchError = shallowRef<ApiError | null>(null);
  const mapping = ref<ImportMapping>({});
  const remapping = ref(false);
  const mappingError = shallowRef<ApiError | null>(null);

  const filter = ref<ImportRowFilter>('all');
  const previewPage = ref(1);
  const previewLoading = ref(false);

  const committing = ref(false);
  const commitError = shallowRef<ApiError | null>(null);
  const result = ref<ImportCommitResult | null>(null);

  const batches = shallowRef<ListResult<ImportBatchSummary> | null>(null);
  const batchesLoading = ref(false);
  const batchesError = shallowRef<ApiError | null>(null);

  const batchId = computed(() => batchIdFrom(route.query.batch));
  const mappingChanged = computed(() => (batch.value ? !sameMapping(mapping.value, batch.value.mapping) : false));

  let pollTimer: ReturnType<typeof setTimeout> | undefined;
  let disposed = false;
  /** The batch this page is opening itself (so the address watcher does not open it twice). */
  let openingId: number | null = null;

  const asApiError = (error: unknown) =>
    error instanceof ApiError ? error : new ApiError(0, 'client', error instanceof Error ? error.message : String(error));

  async function loadBatches(): Promise<void> {
    batchesLoading.value = true;
    batchesError.value = null;
    try {
      batches.value = await importsApi.list({ pageSize: 10, sort: '-createdAt' });
    } catch (error) {
      batchesError.value = asApiError(error);
    } finally {
      batchesLoading.value = false;
    }
  }

  function applyPreview(preview: ImportPreviewResult | ImportDetail): void {
    mapping.value = { ...preview.mapping };
    siteId.value = preview.siteId;
  }

  /** Fetch the batch (the page of rows in view); `resume` also picks the step from its status. */
  async function fetchBatch(id: number, resume: boolean): Promise<void> {
    const detail = await importsApi.get(id, { filter: filter.value, page: previewPage.value, pageSize: PREVIEW_PAGE_SIZE });
    if (disposed || batchId.value !== id) return;
    const statusChanged = batch.value?.id !== id || batch.value.status !== detail.status;
    batch.value = detail;
    if (resume || statusChanged) applyPreview(detail);
    if (resume) step.value = stepFor(detail.status);
    if (detail.status === 'committed' || detail.status === 'undone') result.value = resultOf(detail);
    schedulePoll();
  }

  function schedulePoll(): void {
    clearTimeout(pollTimer);
    const current = batch.value;
    if (disposed || !current || !isBusy(current.status)) return;
    pollTimer = setTimeout(() => {
      void fetchBatch(current.id, false).catch((error: unknown) => {
        batchError.value = asApiError(error);
      });
    }, POLL_INTERVAL_MS);
  }

  async function openBatch(id: number): Promise<void> {
    loadingBatch.value = true;
    batchError.value = null;
    commitError.value = null;
    mappingError.value = null;
    result.value = null;
    filter.value = 'all';
    previewPage.value = 1;
    try {
      await fetchBatch(id, true);
    } catch (error) {
      batch.value = null;
      batchError.value = asApiError(error);
    } finally {
      loadingBatch.value = false;
    }
  }

  /** Step 1 → 2: send the file; the server parses it, suggests a mapping and checks every row. */
  async function upload(): Promise<boolean> {
    if (!file.value || siteId.value === null) return false;
    uploadError.value = null;
    uploadProgress.value = 0;
    try {
      const preview = await importsApi.upload(
        { file: file.value, siteId: siteId.value },
        { onProgress: (fraction) => (uploadProgress.value = fraction) },
      );
      openingId = preview.id;
      await router.replace({ query: { ...route.query, batch: String(preview.id) } });
      await openBatch(preview.id);
      openingId = null;
      step.value = 'mapping';
      void loadBatches();
      return true;
    } catch (error) {
      openingId = null;
      uploadError.value = asApiError(error);
      return false;
    } finally {
      uploadProgress.value = null;
    }
  }

  /** Step 2 → 3: validate again with the edited mapping (only when it changed). */
  async function applyMapping(): Promise<boolean> {
    const current = batch.value;
    if (!current) return false;
    mappingError.value = null;
    if (!mappingChanged.value) {
      step.value = 'preview';
      return true;
    }
    remapping.value = true;
    try {
      await importsApi.remap(current.id, mapping.value);
      previewPage.value = 1;
      await fetchBatch(current.id, false);
      mapping.value = { ...(batch.value?.mapping ?? mapping.value) };
      step.value = 'preview';
      return true;
    } catch (error) {
      mappingError.value = asApiError(error);
      return false;
    } finally {
      remapping.value = false;
    }
  }

  async function loadPreviewPage(page: number, nextFilter: ImportRowFilter = filter.value): Promise<void> {
    const current = batch.value;
    if (!current) return;
    previewPage.value = page;
    filter.value = nextFilter;
    previewLoading.value = true;
    try {
      await fetchBatch(current.id, false);
    } catch (error) {
      batchError.value = asApiError(error);
    } finally {
      previewLoading.value = false;
    }
  }

  /** Step 3 → 4: write every valid row in one transaction, showing the server's progress meanwhile. */
  async function commit(): Promise<boolean> {
    const current = batch.value;
    if (!current) return false;
    committing.value = true;
    commitError.value = null;
    step.value = 'commit';
    // The commit answers when it is done; poll for its progress in the meantime.
    const poll = setInterval(() => {
      void importsApi
        .get(current.id, { page: 1, pageSize: 1 })
        .then((detail) => {
          if (committing.value && batch.value?.id === detail.id) batch.value = { ...batch.value, status: detail.status, progress: detail.progress };
        })
        .catch(() => undefined);
    }, POLL_INTERVAL_MS);
    try {
      result.value = await importsApi.commit(current.id);
      await fetchBatch(current.id, false);
      void loadBatches();
      return true;
    } catch (error) {
      commitError.value = asApiError(error);
      await fetchBatch(current.id, false).catch(() => undefined);
      if (batch.value && !isBusy(batch.value.status) && batch.value.status !== 'committed') step.value = 'preview';
      return false;
    } finally {
      clearInterval(poll);
      committing.value = false;
    }
  }

  /** Undo a committed batch, or discard a preview. */
  async function undo(id: number): Promise<void> {
    await importsApi.undo(id);
    if (batch.value?.id === id) await fetchBatch(id, true).catch(() => undefined);
    await loadBatches();
  }

  /** Back to step 1 with nothing open (the batch, if any, stays listed). */
  async function startOver(): Promise<void> {
    clearTimeout(pollTimer);
    batch.value = null;
    result.value = null;
    file.value = null;
    uploadError.value = null;
    commitError.value = null;
    mapping.value = {};
    step.value = 'file';
    const { batch: _dropped, ...rest } = route.query;
    await router.replace({ query: rest });
  }

  async function downloadTemplate(): Promise<void> {
    const template = await importsApi.template();
    saveBlob(template.blob, template.fileName);
  }

  // Follow the address: a batch opened from the list, the browser's back button, a pasted link.
  watch(batchId, (id) => {
    if (id === null) {
      if (batch.value) void startOver();
    } else if (batch.value?.id !== id && openingId !== id) void openBatch(id);
  });

  async function start(): Promise<void> {
    await Promise.all([batchId.value !== null ? openBatch(batchId.value) : Promise.resolve(), loadBatches()]);
  }

  onBeforeUnmount(() => {
    disposed = true;
    clearTimeout(pollTimer);
  });

  return {
    step,
    siteId,
    file,
    uploadProgress,
    uploadError,
    batch,
    batchId,
    loadingBatch,
    batchError,
    mapping,
    mappingChanged,
    remapping,
    mappingError,
    filter,
    previewPage,
    previewLoading,
    committing,
    commitError,
    result,
    batches,
    batchesLoading,
    batchesError,
    start,
    openBatch,
    upload,
    applyMapping,
    loadPreviewPage,
    commit,
    undo,
    startOver,
    loadBatches,
    downloadTemplate,
  };
}
