"use client";

import { useState } from "react";
import type { ColumnFiltersState, DataTableProps, SortingState } from "@/components/data-table";
import { useApi } from "./use-api";

interface PagedAnswer {
  total: number;
  page: number;
  pageSize: number;
}

export interface ServerTableOptions {
  /**
   * Sorting, the named column filters and the search go to the route as query parameters
   * (`sort`, `dir`, one per filter, `q`) with `page`; any change of them returns to page 1.
   * Without it the route answers every row and the table sorts and filters them itself.
   */
  server?: { initialSorting: SortingState; filterParams: readonly string[] };
  /** More query parameters (placed after `page`); the caller returns to page 1 when they change. */
  params?: Record<string, string>;
  /** False while the parameters are incomplete: nothing is fetched. */
  enabled?: boolean;
}

/** The route's URL for one page: `page`, the extra parameters, the set filters, `q`, `sort` and `dir`. */
export function serverTableUrl(
  path: string,
  s: { page: number; params?: Record<string, string>; filterParams: readonly string[]; filters: ColumnFiltersState; search: string; sorting: SortingState },
): string {
  const q = new URLSearchParams({ page: String(s.page), ...s.params });
  for (const id of s.filterParams) {
    const v = s.filters.find((f) => f.id === id)?.value as string | undefined;
    if (v) q.set(id, v);
  }
  if (s.search) q.set("q", s.search);
  if (s.sorting[0]) {
    q.set("sort", s.sorting[0].id);
    q.set("dir", s.sorting[0].desc ? "desc" : "asc");
  }
  return `${path}?${q}`;
}

/**
 * The back office's tables over our admin routes in one place: the fetch, the DataTable's
 * loading/error/retry props and, for server-driven tables, sorting, filters and search sent to
 * the route with the page. Spread `table` into <DataTable>; `pager` feeds <Pager> when paged.
 */
export function useServerTable<Row extends { id: string }, Answer extends { rows: Row[] }>(path: string, opts: ServerTableOptions = {}) {
  const [sorting, setSorting] = useState<SortingState>(opts.server?.initialSorting ?? []);
  const [filters, setFilters] = useState<ColumnFiltersState>([]);
  const [search, setSearch] = useState("");
  const [page, setPage] = useState(1);
  const filterValue = (id: string) => filters.find((f) => f.id === id)?.value as string | undefined;

  const url = opts.server ? serverTableUrl(path, { page, params: opts.params, filterParams: opts.server.filterParams, filters, search, sorting }) : path;
  const { data, error, isLoading, reload } = useApi<Answer>(opts.enabled === false ? null : url);

  const manual: DataTableProps<Row>["manual"] = opts.server
    ? {
        sorting,
        onSortingChange: (u) => (setSorting(u), setPage(1)),
        columnFilters: filters,
        onColumnFiltersChange: (u) => (setFilters(u), setPage(1)),
        search,
        onSearchChange: (v) => (setSearch(v), setPage(1)),
      }
    : undefined;
  const paged = data && "total" in data ? (data as Answer & PagedAnswer) : null;

  return {
    data,
    filterValue,
    /** Back to the first page (when a parameter outside the table changes). */
    firstPage: () => setPage(1),
    table: { data: data?.rows, isLoading, error, onRetry: reload, getRowId: (r: Row) => r.id, manual },
    pager: opts.server && paged ? { page: paged.page, pageSize: paged.pageSize, total: paged.total, onPage: setPage } : null,
  };
}
