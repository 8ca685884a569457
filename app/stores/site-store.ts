// The site being looked at or edited. Lists page through useSiteList; this store holds one site so
// the detail and the form pages share it (no second request when going from one to the other).
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { SiteCreate, SiteOutput } from 'shared/site';
import { sitesApi, type SiteUpdate } from 'src/api/sites';

export const useSiteStore = defineStore('site', () => {
  const current = ref<SiteOutput | null>(null);
  const loading = ref(false);

  /** Load a site, reusing the one in hand unless `fresh` is asked for. */
  async function load(id: number, fresh = false): Promise<SiteOutput> {
    if (!fresh && current.value?.id === id) return current.value;
    loading.value = true;
    try {
      current.value = await sitesApi.get(id);
      return current.value;
    } finally {
      loading.value = false;
    }
  }

  async function create(body: SiteCreate): Promise<SiteOutput> {
    current.value = await sitesApi.create(body);
    return current.value;
  }

  /** Save changes; the body carries the version that was loaded (409 if someone saved since). */
  async function update(id: number, body: SiteUpdate): Promise<SiteOutput> {
    current.value = await sitesApi.update(id, body);
    return current.value;
  }

  async function setArchived(site: SiteOutput, archived: boolean): Promise<SiteOutput> {
    current.value = await sitesApi.setArchived(site.id, archived, site.version);
    return current.value;
  }

  function forget(): void {
    current.value = null;
  }

  return { current, loading, load, create, update, setArchived, forget };
});
