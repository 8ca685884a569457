// The Motor register: one page of motors at a time from the server (paged, sorted, filtered there,
// so 100,000 motors cost the browser no more than 25), filters kept in the address so a reload or
// "back" from a motor shows the same list, a remembered column choice, and a selection for bulk
// actions (export today; more later).
import { computed, onBeforeUnmount, ref, watch } from 'vue';
import { useRoute, useRouter, type LocationQuery, type LocationQueryRaw } from 'vue-router';
import type { MotorOutput } from 'shared/motor';
import { APPLICATIONS, CONTROL_METHODS, EFFICIENCY_CLASSES, MOTOR_STATUSES } from 'shared/motor';
import { motorsApi, type MotorListQuery } from 'src/api/motors';
import { saveBlob } from 'src/api/transfer';
import type { Application, ControlMethod, EfficiencyClass, MotorStatus } from 'components/motor-form';
import { useSessionStore } from 'stores/session-store';
import { toSortParam, usePagedTable } from './usePagedTable';

export interface MotorFilters {
  q: string;
  siteId: number[];
  area: string;
  application: Application[];
  efficiencyClass: EfficiencyClass[];
  status: MotorStatus[];
  controlMethod: ControlMethod[];
  /** Power range [kW]; the inputs show the user's unit. */
  minKw: number | null;
  maxKw: number | null;
}

export function emptyFilters(): MotorFilters {
  return { q: '', siteId: [], area: '', application: [], efficiencyClass: [], status: [], controlMethod: [], minKw: null, maxKw: null };
}

function first(value: LocationQuery[string] | undefined): string {
  const item = Array.isArray(value) ? value[0] : value;
  return typeof item === 'string' ? item : '';
}

function listOf<T extends string>(value: LocationQuery[string] | undefined, allowed: readonly T[]): T[] {
  return first(value)
    .split(',')
    .map((item) => item.trim())
    .filter((item): item is T => (allowed as readonly string[]).includes(item));
}

function numberOrNull(value: LocationQuery[string] | undefined): number | null {
  const text = first(value);
  if (text === '') return null;
  const number = Number(text);
  return Number.isFinite(number) && number >= 0 ? number : null;
}

/** Filters from the address (`?q=fan&application=fan,pump&minKw=10`); unknown values are dropped. */
export function filtersFromQuery(query: LocationQuery): MotorFilters {
  return {
    q: first(query.q).slice(0, 100),
    siteId: first(query.siteId)
      .split(',')
      .map(Number)
      .filter((id) => Number.isInteger(id) && id > 0),
    area: first(query.area).slice(0, 80),
    application: listOf(query.application, APPLICATIONS),
    efficiencyClass: listOf(query.efficiencyClass, EFFICIENCY_CLASSES),
    status: listOf(query.status, MOTOR_STATUSES),
    controlMethod: listOf(query.controlMethod, CONTROL_METHODS),
    minKw: numberOrNull(query.minKw),
    maxKw: numberOrNull(query.maxKw),
  };
}

/** The filters as the API (and the address) take them; empty ones left out. */
export function filtersToQuery(filters: MotorFilters): MotorListQuery {
  const query: MotorListQuery = {};
  if (filters.q.trim()) query.q = filters.q.trim();
  if (filters.siteId.length) query.siteId = filters.siteId;
  if (filters.area.trim()) query.area = filters.area.trim();
  if (filters.application.length) query.application = filters.application;
  if (filters.efficiencyClass.length) query.efficiencyClass = filters.efficiencyClass;
  if (filters.status.length) query.status = filters.status;
  if (filters.controlMethod.length) query.controlMethod = filters.controlMethod;
  if (filters.minKw !== null) query.minKw = filters.minKw;
  if (filters.maxKw !== null) query.maxKw = filters.maxKw;
  return query;
}

function toLocationQuery(query: MotorListQuery): LocationQueryRaw {
  const location: LocationQueryRaw = {};
  for (const [key, value] of Object.entries(query) as [string, unknown][]) {
    location[key] = Array.isArray(value) ? value.join(',') : String(value);
  }
  return location;
}

/** How many filters narrow the list (the search text counts as one). */
export function activeFilterCount(filters: MotorFilters): number {
  return Object.keys(filtersToQuery(filters)).length;
}

/** The columns a user chose to see, remembered per user in localStorage. */
export function useColumnChoice(storageName: string, all: readonly string[], defaults: readonly string[], required: readonly string[] = []) {
  const session = useSessionStore();
  const key = `statorline.${storageName}.columns.${session.user?.id ?? 'anonymous'}`;
  const read = (): string[] => {
    try {
      const stored: unknown = JSON.parse(globalThis.localStorage?.getItem(key) ?? 'null');
      if (Array.isArray(stored)) {
        const known = stored.filter((name): name is string => typeof name === 'string' && all.includes(name));
        if (known.length > 0) return [...new Set([...required, ...known])];
      }
    } catch {
      // Unreadable: the defaults.
    }
    return [...defaults];
  };
  const visible = ref<string[]>(read());
  watch(visible, (names) => {
    try {
      globalThis.localStorage?.setItem(key, JSON.stringify(names));
    } catch {
      // Storage refused: the choice lasts for this visit.
    }
  });
  function toggle(name: string, shown: boolean): void {
    if (required.includes(name)) return;
    visible.value = shown ? all.filter((column) => column === name || visible.value.includes(column)) : visible.value.filter((column) => column !== name);
  }
  function reset(): void {
    visible.value = [...defaults];
  }
  return { visible, toggle, reset };
}

/** Wait this long after the last filter change before asking the server [ms]. */
export const FILTER_DEBOUNCE_MS = 250;

export function useMotorRegister() {
  const route = useRoute();
  const router = useRouter();
  const filters = ref<MotorFilters>(filtersFromQuery(route.query));
  const table = usePagedTable<MotorOutput>((request) => motorsApi.list({ ...request, ...filtersToQuery(filters.value) }), { sortBy: 'tag' });
  const selected = ref<MotorOutput[]>([]);
  const exporting = ref(false);
  const filterCount = computed(() => activeFilterCount(filters.value));

  let timer: ReturnType<typeof setTimeout> | undefined;
  watch(
    filters,
    () => {
      clearTimeout(timer);
      timer = setTimeout(() => {
        void router.replace({ name: route.name ?? 'motors', query: toLocationQuery(filtersToQuery(filters.value)) });
        void table.reload(true);
      }, FILTER_DEBOUNCE_MS);
    },
    { deep: true },
  );
  onBeforeUnmount(() => clearTimeout(timer));

  function clearFilters(): void {
    filters.value = emptyFilters();
  }

  /** Every motor the filters match, sorted as shown, as .xlsx (the server writes it). */
  async function exportFiltered(): Promise<void> {
    exporting.value = true;
    try {
      const sort = toSortParam(table.pagination.value.sortBy, table.pagination.value.descending);
      const file = await motorsApi.exportXlsx({ ...filtersToQuery(filters.value), ...(sort ? { sort } : {}) });
      saveBlob(file.blob, file.fileName);
    } finally {
      exporting.value = false;
    }
  }

  /** The selected motors as .xlsx, written in the browser in the export's own layout. */
  async function exportSelected(): Promise<void> {
    exporting.value = true;
    try {
      const { selectedMotorsWorkbook } = await import('components/motors-export');
      const blob = await selectedMotorsWorkbook(selected.value);
      saveBlob(blob, `motor-register-selection-${new Date().toISOString().slice(0, 10)}.xlsx`);
    } finally {
      exporting.value = false;
    }
  }

  return { ...table, filters, filterCount, clearFilters, selected, exporting, exportFiltered, exportSelected };
}
