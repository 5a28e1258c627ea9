"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { writeAudit } from "@/db/queries/audit";
import { resendFailedEmail } from "@/lib/email/outbox";
import { AppError } from "@/lib/errors";
import { defineAction } from "@/lib/server/define-action";

/** Send a failed e-mail again (its attempts ran out, or the e-mail API refused it); audited. */
export const resendEmail = defineAction({ access: "admin:outbox", input: z.object({ jobId: z.string().min(1).max(64) }) }, async (input, { user, db }) => {
  const r = await resendFailedEmail(db, input.jobId);
  if (!r.reset) throw new AppError("conflict:email", "That e-mail has not failed (it may be sending again already).");
  await writeAudit(db, { actorId: user.id, action: "email.resend", entityType: "email_job", entityId: input.jobId, after: { sent: r.sent } });
  revalidatePath("/admin/outbox");
  return { sent: r.sent };
});
