// The organisation's sites as choices for a select (register filter, motor form, intake). An
// organisation has a handful of sites, so one page of up to 500 is all of them.
import { computed, ref, shallowRef } from 'vue';
import type { SiteOutput } from 'shared/site';
import { sitesApi } from 'src/api/sites';

export function useSiteOptions() {
  const sites = shallowRef<SiteOutput[]>([]);
  const loading = ref(false);
  const error = shallowRef<unknown>(null);

  async function load(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      sites.value = (await sitesApi.list({ pageSize: 500, sort: 'name', archived: 'exclude' })).items;
    } catch (caught) {
      error.value = caught;
    } finally {
      loading.value = false;
    }
  }

  const options = computed(() => sites.value.map((site) => ({ label: site.name, value: site.id })));
  const byId = (id: number | null | undefined) => sites.value.find((site) => site.id === id) ?? null;

  return { sites, options, loading, error, load, byId };
}
