import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "./data-table";

interface Row {
  ref: string;
  stage: string;
  total: number;
}
const columns: ColumnDef<Row, unknown>[] = [
  { accessorKey: "ref", header: "Ref" },
  { accessorKey: "stage", header: "Stage" },
  { accessorKey: "total", header: "Total" },
];
const data: Row[] = [
  { ref: "LW-3", stage: "quoted", total: 300 },
  { ref: "LW-1", stage: "draft", total: 100 },
  { ref: "LW-2", stage: "shipped", total: 200 },
];
const text = (html: string) => html.replace(/<[^>]+>/g, " ").replace(/\s+/g, " ");

describe("DataTable", () => {
  it("sorts by the initial sorting", () => {
    const html = renderToStaticMarkup(<DataTable label="t" columns={columns} data={data} initialSorting={[{ id: "total", desc: true }]} />);
    const t = text(html);
    expect(t.indexOf("LW-3")).toBeLessThan(t.indexOf("LW-2"));
    expect(t.indexOf("LW-2")).toBeLessThan(t.indexOf("LW-1"));
    expect(html).toContain('aria-sort="descending"');
  });

  it("shows the empty state when there are no rows", () => {
    const html = renderToStaticMarkup(<DataTable label="t" columns={columns} data={[]} empty={{ title: "No requests yet" }} />);
    expect(text(html)).toContain("No requests yet");
    expect(html).not.toContain("<table");
  });

  it("shows skeleton rows while loading", () => {
    const html = renderToStaticMarkup(<DataTable label="t" columns={columns} data={undefined} isLoading skeletonRows={3} />);
    expect(html).toContain('aria-busy="true"');
    expect(html.match(/animate-pulse/g)?.length).toBe(9);
  });

  it("shows the error with a retry button", () => {
    const html = renderToStaticMarkup(<DataTable label="t" columns={columns} data={data} error="Could not load" onRetry={() => {}} />);
    expect(text(html)).toContain("Could not load");
    expect(text(html)).toContain("Try again");
    expect(html).not.toContain("LW-1");
  });

  it("in manual mode shows the rows as given, with the no-match line when a search finds none", () => {
    const manual = {
      sorting: [],
      onSortingChange: () => {},
      columnFilters: [],
      onColumnFiltersChange: () => {},
      search: "zzz",
      onSearchChange: () => {},
    };
    const html = renderToStaticMarkup(<DataTable label="t" columns={columns} data={[]} manual={manual} noMatch="Nothing matches" />);
    expect(text(html)).toContain("Nothing matches");
    const html2 = renderToStaticMarkup(<DataTable label="t" columns={columns} data={data} manual={{ ...manual, search: "" }} />);
    const t = text(html2);
    expect(t.indexOf("LW-3")).toBeLessThan(t.indexOf("LW-1"));
  });
});
