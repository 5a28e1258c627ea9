"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { archiveAddress, createAddress, getAddress, setDefaultShipTo, updateAddress } from "@/db/queries/addresses";
import { writeAudit } from "@/db/queries/audit";
import { AppError } from "@/lib/errors";
import { defineAction } from "@/lib/server/define-action";
import { addressSchema } from "@/lib/validation/address";

const idSchema = z.string().min(1).max(64);

async function firmOf(user: { orgId: string | null }) {
  if (!user.orgId) throw new AppError("forbidden", "Your account is not part of a client firm.");
  return user.orgId;
}

/** Add a shipping address (the first becomes the default), or set the billing address. */
export const addAddress = defineAction(
  { access: "billing:manage", input: z.object({ kind: z.enum(["billing", "shipping"]), makeDefault: z.boolean().optional(), address: addressSchema }) },
  async (input, { user, db }) => {
    const orgId = await firmOf(user);
    const row = await db.transaction(async (tx) => {
      const a = await createAddress(tx, { orgId, kind: input.kind, values: input.address, makeDefault: input.makeDefault, actorId: user.id });
      await writeAudit(tx, { actorId: user.id, action: "address.add", entityType: "address", entityId: a.id, orgId, after: { kind: a.kind, ...input.address, isDefault: a.isDefault } });
      return a;
    });
    revalidatePath("/portal/firm");
    return { id: row.id };
  },
);

export const editAddress = defineAction({ access: "billing:manage", input: z.object({ id: idSchema, address: addressSchema }) }, async (input, { user, db }) => {
  const orgId = await firmOf(user);
  await db.transaction(async (tx) => {
    const before = await getAddress(tx, orgId, input.id);
    if (!before || !(await updateAddress(tx, orgId, input.id, input.address))) throw new AppError("not_found:address", "That address was not found.");
    await writeAudit(tx, { actorId: user.id, action: "address.edit", entityType: "address", entityId: input.id, orgId, before, after: input.address });
  });
  revalidatePath("/portal/firm");
  return { id: input.id };
});

/** The ship-to new estimates are priced to and acceptance offers first. */
export const makeDefaultShipTo = defineAction({ access: "billing:manage", input: z.object({ id: idSchema }) }, async (input, { user, db }) => {
  const orgId = await firmOf(user);
  await db.transaction(async (tx) => {
    if (!(await setDefaultShipTo(tx, orgId, input.id))) throw new AppError("not_found:address", "That shipping address was not found.");
    await writeAudit(tx, { actorId: user.id, action: "address.default", entityType: "address", entityId: input.id, orgId });
  });
  revalidatePath("/portal/firm");
  return { id: input.id };
});

/** Remove a shipping address from the book; orders keep the copy they shipped to. */
export const removeAddress = defineAction({ access: "billing:manage", input: z.object({ id: idSchema }) }, async (input, { user, db }) => {
  const orgId = await firmOf(user);
  await db.transaction(async (tx) => {
    if (!(await archiveAddress(tx, orgId, input.id, new Date()))) throw new AppError("not_found:address", "That shipping address was not found.");
    await writeAudit(tx, { actorId: user.id, action: "address.remove", entityType: "address", entityId: input.id, orgId });
  });
  revalidatePath("/portal/firm");
  return { id: input.id };
});
