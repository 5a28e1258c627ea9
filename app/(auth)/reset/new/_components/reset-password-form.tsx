"use client";

import { useActionState } from "react";
import { resetPasswordAction } from "@/app/(auth)/reset/actions";
import { keepFieldsOnSubmit } from "@/components/auth/use-kept-form";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input } from "@/components/ui/input";

export function ResetPasswordForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState(resetPasswordAction, null);
  const errors = state && !state.ok ? state.fieldErrors : undefined;
  return (
    <form action={action} onSubmit={keepFieldsOnSubmit(action)} className="space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <Field label="New password" htmlFor="password" error={errors?.password?.[0]} hint="At least 10 characters, with a digit.">
        <Input id="password" name="password" type="password" autoComplete="new-password" aria-invalid={Boolean(errors?.password)} />
      </Field>
      <Field label="New password again" htmlFor="confirm" error={errors?.confirm?.[0]}>
        <Input id="confirm" name="confirm" type="password" autoComplete="new-password" aria-invalid={Boolean(errors?.confirm)} />
      </Field>
      <FormMessage>{state && !state.ok && !errors ? state.message : undefined}</FormMessage>
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? "Saving…" : "Set new password"}
      </Button>
    </form>
  );
}
