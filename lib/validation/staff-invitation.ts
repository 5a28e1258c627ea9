import { z } from "zod";
import { signUpSchema } from "./auth";

/** Invitation tokens are 32 random bytes in base64url (43 characters), like reset tokens. */
export const INVITE_TOKEN = /^[A-Za-z0-9_-]{43}$/;

export const acceptInvitationSchema = z
  .object({
    token: z.string().regex(INVITE_TOKEN, "This invitation link is not valid. Ask your bureau's admin for a new one."),
    name: signUpSchema.shape.name,
    password: signUpSchema.shape.password,
    confirm: z.string().max(200),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });
