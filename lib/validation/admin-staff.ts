import { z } from "zod";
import { STAFF_ROLES } from "../../db/schema/common";

export const inviteStaffSchema = z.object({
  email: z.email("Enter a valid e-mail address.").max(320).transform((e) => e.toLowerCase()),
  role: z.enum(STAFF_ROLES),
});

export const updateStaffSchema = z.object({
  userId: z.string().min(1).max(64),
  role: z.enum(STAFF_ROLES).optional(),
  isControlledCleared: z.boolean().optional(),
  disabled: z.boolean().optional(),
});

export const auditQuerySchema = z.object({
  actorId: z.string().max(64).optional(),
  entityType: z.string().max(64).optional(),
  action: z.string().max(64).optional(),
  from: z.iso.date().optional(),
  to: z.iso.date().optional(),
  page: z.coerce.number().int().min(1).max(10_000).optional(),
  pageSize: z.coerce.number().int().min(1).max(200).optional(),
});

export const resetTwoFactorSchema = z.object({
  userId: z.string().min(1).max(64),
});
