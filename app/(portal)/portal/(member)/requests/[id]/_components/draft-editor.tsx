import { getDb } from "@/db/client";
import type { getRequest } from "@/db/queries/requests";
import { RequestForm } from "@/app/(portal)/portal/(member)/requests/_components/request-form/request-form";
import { loadDraft, loadFormCatalogue } from "@/app/(portal)/portal/(member)/requests/_components/request-form/load";
import { PageHeader } from "@/components/ui/card";

type Request = NonNullable<Awaited<ReturnType<typeof getRequest>>>;

/** A draft request, still being written: the three-step form, saved as the client types. */
export async function DraftEditor({ req, units }: { req: Request; units: "mm" | "in" }) {
  const db = getDb();
  const [catalogue, draft] = await Promise.all([loadFormCatalogue(db, units), loadDraft(db, req, units)]);
  return (
    <>
      <PageHeader title={req.projectName || "New request"} subtitle={`Draft ${req.reference} — not sent to the bureau yet.`} />
      <RequestForm initial={draft.values} initialFiles={draft.files} reference={req.reference} catalogue={catalogue} />
    </>
  );
}
