"use client";

import { useSyncExternalStore } from "react";
import { RequestsTable } from "@/app/(portal)/portal/_components/requests-table";
import { Skeleton } from "@/components/ui/card";

const noSubscription = () => () => {};

/**
 * The requests table, mounted in the browser only. Its rows come from the list API after the
 * page loads either way, so rendering the table on the server drew only an empty, loading table
 * at a real cost per page answer (the table's column model, filters and options); the server now
 * sends this outline of it instead, and the browser swaps in the table as soon as it runs.
 */
export function RequestsSlot({ showAuthor }: { showAuthor: boolean }) {
  // false on the server and while hydrating, true once mounted in the browser
  const mounted = useSyncExternalStore(noSubscription, () => true, () => false);
  if (mounted) return <RequestsTable showAuthor={showAuthor} />;
  return (
    <div className="space-y-3" role="status" aria-label="Loading your requests">
      <div className="flex flex-col gap-2 sm:flex-row">
        <Skeleton className="h-9 sm:w-72" />
        <Skeleton className="h-9 sm:w-48" />
      </div>
      <div className="space-y-3 rounded-md bg-white p-4 ring-1 ring-paper-200">
        <Skeleton className="h-4 w-1/3" />
        {Array.from({ length: 5 }, (_, i) => (
          <Skeleton key={i} className="h-4 w-full" />
        ))}
      </div>
    </div>
  );
}
