export { DataTable, type DataTableFilter, type DataTableProps } from "./data-table";
export type { ColumnDef, SortingState, ColumnFiltersState } from "@tanstack/react-table";
