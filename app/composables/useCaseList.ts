// The Business cases list (server paging and sorting, status and scope filters) and the generation
// of a new case for a site or for the whole organisation.
import { ref, shallowRef, watch } from 'vue';
import type { CaseOutput, CaseScope, CaseStatus, CaseSummary } from 'shared/case';
import type { SiteOutput } from 'shared/site';
import { ApiError } from 'src/api/client';
import { casesApi } from 'src/api/cases';
import { sitesApi } from 'src/api/sites';
import { usePagedTable } from './usePagedTable';

export function useCaseList() {
  const status = ref<CaseStatus | null>(null);
  const scope = ref<CaseScope | null>(null);
  const table = usePagedTable<CaseSummary>(
    (request) => casesApi.list({ ...request, status: status.value ?? undefined, scope: scope.value ?? undefined }),
    { sortBy: 'createdAt', descending: true },
  );
  watch([status, scope], () => void table.reload(true));
  return { ...table, status, scope };
}

/** What a new case covers: one site's id, or 'all' for the whole organisation. */
export type CaseTarget = number | 'all';

function asApiError(caught: unknown): ApiError {
  return caught instanceof ApiError ? caught : new ApiError(0, 'client', caught instanceof Error ? caught.message : String(caught));
}

/** The sites a case can be generated for, and the generation itself. */
export function useCaseGenerate() {
  const sites = shallowRef<SiteOutput[]>([]);
  const sitesLoading = ref(false);
  const sitesError = shallowRef<ApiError | null>(null);
  const generating = ref(false);
  const generateError = shallowRef<ApiError | null>(null);

  async function loadSites(): Promise<void> {
    sitesLoading.value = true;
    sitesError.value = null;
    try {
      sites.value = (await sitesApi.list({ pageSize: 500, sort: 'name', archived: 'exclude' })).items;
    } catch (caught) {
      sitesError.value = asApiError(caught);
    } finally {
      sitesLoading.value = false;
    }
  }

  /** Generate the snapshot; null when it failed (`generateError` says why). */
  async function generate(target: CaseTarget): Promise<CaseOutput | null> {
    generating.value = true;
    generateError.value = null;
    try {
      return await casesApi.create(target === 'all' ? { all: true } : { siteId: target });
    } catch (caught) {
      generateError.value = asApiError(caught);
      return null;
    } finally {
      generating.value = false;
    }
  }

  return { sites, sitesLoading, sitesError, loadSites, generating, generateError, generate };
}
