import { PageSkeleton } from "@/components/ui/card";

/**
 * Only on pages that never answer 404: a loading boundary commits the HTTP status before the
 * page runs, so pages that check a record's firm (requests, receipts) must not sit under one.
 */
export default function Loading() {
  return <PageSkeleton />;
}
