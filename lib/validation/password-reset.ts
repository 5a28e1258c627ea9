import { z } from "zod";
import { signUpSchema } from "./auth";

export const resetRequestSchema = z.object({
  email: z.email("Enter a valid e-mail address.").max(320),
});

export const resetPasswordSchema = z
  .object({
    token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, "This reset link is not valid. Ask for a new one."),
    password: signUpSchema.shape.password,
    confirm: z.string().max(200),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });
