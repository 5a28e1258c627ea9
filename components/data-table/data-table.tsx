"use client";

import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type ColumnFiltersState,
  type OnChangeFn,
  type Row,
  type SortingState,
} from "@tanstack/react-table";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { EmptyState, Skeleton } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/input";
import { cn } from "@/components/ui/cn";

export interface DataTableFilter {
  /** Column id the filter applies to. */
  columnId: string;
  label: string;
  options: { value: string; label: string }[];
}

export interface DataTableProps<T> {
  columns: ColumnDef<T, unknown>[];
  data: T[] | undefined;
  /** Accessible name of the table. */
  label: string;
  getRowId?: (row: T) => string;
  isLoading?: boolean;
  /** A message to show instead of rows; `onRetry` adds a retry button. */
  error?: string | null;
  onRetry?: () => void;
  searchPlaceholder?: string;
  filters?: DataTableFilter[];
  empty?: { title: string; body?: React.ReactNode };
  /** Shown when rows exist but none match the search and filters. */
  noMatch?: string;
  initialSorting?: SortingState;
  /**
   * Server-driven mode: the caller owns sorting, filters and search (e.g. sends them to an API
   * route) and passes already-sorted, filtered rows. Without it, the table sorts and filters
   * the rows it is given.
   */
  manual?: {
    sorting: SortingState;
    onSortingChange: OnChangeFn<SortingState>;
    columnFilters: ColumnFiltersState;
    onColumnFiltersChange: OnChangeFn<ColumnFiltersState>;
    search: string;
    onSearchChange: (value: string) => void;
  };
  onRowClick?: (row: Row<T>) => void;
  /** Extra controls beside the search box (export buttons…). */
  toolbar?: React.ReactNode;
  /** Number of skeleton rows while loading. */
  skeletonRows?: number;
}

/**
 * A reusable table: sort by clicking a header, filter by select, free-text search, and plain
 * loading, empty, no-match and error states. Wide tables scroll sideways at phone width.
 */
export function DataTable<T>({
  columns,
  data,
  label,
  getRowId,
  isLoading,
  error,
  onRetry,
  searchPlaceholder = "Search",
  filters = [],
  empty = { title: "Nothing here yet" },
  noMatch = "No rows match the search and filters.",
  initialSorting = [],
  manual,
  onRowClick,
  toolbar,
  skeletonRows = 5,
}: DataTableProps<T>) {
  const [sortingLocal, setSortingLocal] = useState<SortingState>(initialSorting);
  const [filtersLocal, setFiltersLocal] = useState<ColumnFiltersState>([]);
  const [searchLocal, setSearchLocal] = useState("");

  const sorting = manual?.sorting ?? sortingLocal;
  const columnFilters = manual?.columnFilters ?? filtersLocal;
  const search = manual?.search ?? searchLocal;

  const table = useReactTable<T>({
    data: data ?? [],
    columns,
    getRowId,
    state: { sorting, columnFilters, globalFilter: search },
    onSortingChange: manual?.onSortingChange ?? setSortingLocal,
    onColumnFiltersChange: manual?.onColumnFiltersChange ?? setFiltersLocal,
    onGlobalFilterChange: (v: string) => (manual ? manual.onSearchChange(v) : setSearchLocal(v)),
    manualSorting: Boolean(manual),
    manualFiltering: Boolean(manual),
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    globalFilterFn: "includesString",
  });

  const rows = table.getRowModel().rows;
  const hasAnyRows = (data?.length ?? 0) > 0;
  const isFiltered = search.trim() !== "" || columnFilters.length > 0;
  const filterValue = (id: string) => (columnFilters.find((f) => f.id === id)?.value as string | undefined) ?? "";
  const setFilter = (id: string, value: string) =>
    table.setColumnFilters((prev) => [...prev.filter((f) => f.id !== id), ...(value ? [{ id, value }] : [])]);

  return (
    <div className="space-y-3">
      <div className="flex flex-col gap-2 sm:flex-row sm:items-end">
        <div className="sm:w-72">
          <label className="sr-only" htmlFor={`${label}-search`}>
            {searchPlaceholder}
          </label>
          <Input
            id={`${label}-search`}
            type="search"
            placeholder={searchPlaceholder}
            value={search}
            onChange={(e) => table.setGlobalFilter(e.target.value)}
          />
        </div>
        {filters.map((f) => (
          <div key={f.columnId} className="sm:w-48">
            <label className="sr-only" htmlFor={`${label}-filter-${f.columnId}`}>
              {f.label}
            </label>
            <Select id={`${label}-filter-${f.columnId}`} value={filterValue(f.columnId)} onChange={(e) => setFilter(f.columnId, e.target.value)}>
              <option value="">{f.label}: all</option>
              {f.options.map((o) => (
                <option key={o.value} value={o.value}>
                  {o.label}
                </option>
              ))}
            </Select>
          </div>
        ))}
        {toolbar ? <div className="flex gap-2 sm:ml-auto">{toolbar}</div> : null}
      </div>

      {error ? (
        <div role="alert" className="rounded-md border border-red-200 bg-red-50 px-4 py-6 text-center text-sm text-signal-danger">
          <p className="font-medium">{error}</p>
          {onRetry ? (
            <Button variant="secondary" size="sm" className="mt-3" onClick={onRetry}>
              Try again
            </Button>
          ) : null}
        </div>
      ) : !isLoading && !hasAnyRows && !isFiltered ? (
        <EmptyState title={empty.title}>{empty.body}</EmptyState>
      ) : (
        <div tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-ink-600 overflow-x-auto rounded-md bg-white ring-1 ring-paper-200">
          <table className="min-w-full text-sm" aria-label={label} aria-busy={isLoading || undefined}>
            <thead className="bg-paper-100 text-left text-xs uppercase tracking-wide text-ink-500">
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id}>
                  {hg.headers.map((header, hi) => {
                    const canSort = header.column.getCanSort();
                    const dir = header.column.getIsSorted();
                    return (
                      <th
                        key={header.id}
                        scope="col"
                        className={cn("whitespace-nowrap px-4 py-2 font-medium", hi === 0 && "sticky left-0 z-10 bg-paper-100")}
                        aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : canSort ? "none" : undefined}
                      >
                        {header.isPlaceholder ? null : canSort ? (
                          <button
                            type="button"
                            className="inline-flex items-center gap-1 uppercase hover:text-ink-800"
                            onClick={header.column.getToggleSortingHandler()}
                          >
                            {flexRender(header.column.columnDef.header, header.getContext())}
                            <span aria-hidden="true" className="text-ink-400">
                              {dir === "asc" ? "▲" : dir === "desc" ? "▼" : "↕"}
                            </span>
                          </button>
                        ) : (
                          flexRender(header.column.columnDef.header, header.getContext())
                        )}
                      </th>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody className="divide-y divide-paper-200">
              {isLoading && rows.length === 0
                ? Array.from({ length: skeletonRows }, (_, i) => (
                    <tr key={`sk-${i}`}>
                      {table.getVisibleLeafColumns().map((c) => (
                        <td key={c.id} className="px-4 py-3">
                          <Skeleton className="h-4 w-full min-w-12" />
                        </td>
                      ))}
                    </tr>
                  ))
                : rows.map((row) => (
                    <tr
                      key={row.id}
                      className={cn("hover:bg-paper-50", onRowClick && "cursor-pointer")}
                      onClick={onRowClick ? () => onRowClick(row) : undefined}
                    >
                      {row.getVisibleCells().map((cell, ci) => (
                        <td key={cell.id} className={cn("px-4 py-2 align-top", ci === 0 && "sticky left-0 z-10 bg-white")}>
                          {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        </td>
                      ))}
                    </tr>
                  ))}
              {!isLoading && rows.length === 0 ? (
                <tr>
                  <td colSpan={table.getVisibleLeafColumns().length} className="px-4 py-8 text-center text-ink-500">
                    {noMatch}
                  </td>
                </tr>
              ) : null}
            </tbody>
          </table>
          {isLoading && rows.length > 0 ? (
            <p className="border-t border-paper-200 px-4 py-1 text-xs text-ink-400" role="status">
              Refreshing…
            </p>
          ) : null}
        </div>
      )}
    </div>
  );
}
