import { Card, CardTitle } from "@/components/ui/card";
import type { FileRetention } from "@/db/schema";
import { filesDeleteAfter, retentionText } from "@/lib/retention/policy";
import { DeleteFilesButton } from "./delete-files-button";

const day = (d: Date) => new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" }).format(d);

/** A finished order's model files: kept until when, deleted when, and (client admins) delete now. */
export function ModelFilesCard({ requestId, finishedAt, retentionDays, state, canDelete }: { requestId: string; finishedAt: Date | null; retentionDays: number; state: FileRetention | null; canDelete: boolean }) {
  return (
    <Card className="space-y-2" aria-label="Model files">
      <CardTitle>Model files</CardTitle>
      {state?.filesDeletedAt ? (
        <p className="text-sm text-ink-600">
          Deleted from storage on {day(state.filesDeletedAt)}
          {state.filesDeletedCount !== null ? ` (${state.filesDeletedCount} file${state.filesDeletedCount === 1 ? "" : "s"})` : ""}. The order&apos;s record and documents stay.
        </p>
      ) : state?.deletionRequestedAt ? (
        <p className="text-sm text-ink-600">Deletion asked for on {day(state.deletionRequestedAt)}; the files go at the next daily run.</p>
      ) : (
        <>
          <p className="text-sm text-ink-600">
            Kept for {retentionText(retentionDays)} after the order finished
            {finishedAt ? <>, until {day(filesDeleteAfter(finishedAt, retentionDays))}</> : null}, then deleted from storage. Documents stay.
          </p>
          {canDelete ? <DeleteFilesButton requestId={requestId} /> : null}
        </>
      )}
    </Card>
  );
}
