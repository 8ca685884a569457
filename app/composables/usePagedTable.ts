// Server-side pagination, sorting and filtering for a QTable, following the API's list conventions
// (`page`, `pageSize`, `sort` = `field` | `-field` → `{ items, total, page, pageSize }`).
import { ref, shallowRef, type Ref } from 'vue';
import type { QTableProps } from 'quasar';
import type { ListResult } from 'shared/common';
import { ApiError } from 'src/api/client';

export interface PageRequest {
  page: number;
  pageSize: number;
  /** `field` ascending or `-field` descending; absent when the table is unsorted. */
  sort?: string;
}

export interface TablePagination {
  page: number;
  rowsPerPage: number;
  rowsNumber: number;
  sortBy: string | null;
  descending: boolean;
}

export interface PagedTableOptions {
  sortBy?: string;
  descending?: boolean;
  rowsPerPage?: number;
}

type RequestProps = Parameters<NonNullable<QTableProps['onRequest']>>[0];

export const ROWS_PER_PAGE_OPTIONS = [10, 25, 50, 100];

/** The API `sort` parameter for a QTable sort state. */
export function toSortParam(sortBy: string | null, descending: boolean): string | undefined {
  if (!sortBy) return undefined;
  return descending ? `-${sortBy}` : sortBy;
}

export function usePagedTable<Item>(
  fetchPage: (request: PageRequest) => Promise<ListResult<Item>>,
  options: PagedTableOptions = {},
) {
  const rows = shallowRef<Item[]>([]) as Ref<Item[]>;
  const loading = ref(false);
  const error = shallowRef<ApiError | null>(null);
  const pagination = ref<TablePagination>({
    page: 1,
    rowsPerPage: options.rowsPerPage ?? 25,
    rowsNumber: 0,
    sortBy: options.sortBy ?? null,
    descending: options.descending ?? false,
  });
  // Answers can arrive out of order when the user types fast; only the latest one counts.
  let requestNumber = 0;

  async function load(): Promise<void> {
    const mine = ++requestNumber;
    const { page, rowsPerPage, sortBy, descending } = pagination.value;
    const request: PageRequest = { page, pageSize: rowsPerPage };
    const sort = toSortParam(sortBy, descending);
    if (sort) request.sort = sort;
    loading.value = true;
    try {
      const result = await fetchPage(request);
      if (mine !== requestNumber) return;
      rows.value = result.items;
      pagination.value = { ...pagination.value, page: result.page, rowsPerPage: result.pageSize, rowsNumber: result.total };
      error.value = null;
    } catch (caught) {
      if (mine !== requestNumber) return;
      error.value =
        caught instanceof ApiError ? caught : new ApiError(0, 'client', caught instanceof Error ? caught.message : String(caught));
      rows.value = [];
    } finally {
      if (mine === requestNumber) loading.value = false;
    }
  }

  /** The QTable `@request` handler: paging or sorting changed. */
  function onRequest(props: RequestProps): Promise<void> {
    const next = props.pagination;
    pagination.value = {
      ...pagination.value,
      page: next.page ?? 1,
      rowsPerPage: next.rowsPerPage ?? pagination.value.rowsPerPage,
      sortBy: next.sortBy ?? null,
      descending: next.descending ?? false,
    };
    return load();
  }

  /** Load again; back to the first page when the filters changed. */
  function reload(firstPage = false): Promise<void> {
    if (firstPage) pagination.value = { ...pagination.value, page: 1 };
    return load();
  }

  return { rows, loading, error, pagination, onRequest, reload };
}
