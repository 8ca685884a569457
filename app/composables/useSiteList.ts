// The Sites list: a paged, sorted table with a text filter and an archived filter.
import { ref, watch } from 'vue';
import type { SiteOutput } from 'shared/site';
import { sitesApi } from 'src/api/sites';
import { usePagedTable } from './usePagedTable';

export type ArchivedFilter = 'exclude' | 'include' | 'only';

export function useSiteList() {
  const search = ref('');
  const archived = ref<ArchivedFilter>('exclude');
  const table = usePagedTable<SiteOutput>(
    (request) => sitesApi.list({ ...request, q: search.value.trim() || undefined, archived: archived.value }),
    { sortBy: 'name' },
  );
  watch([search, archived], () => void table.reload(true));
  return { ...table, search, archived };
}
