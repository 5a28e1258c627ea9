"use client";

import { useActionState } from "react";
import { requestPasswordResetAction } from "@/app/(auth)/reset/actions";
import { keepFieldsOnSubmit } from "@/components/auth/use-kept-form";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input } from "@/components/ui/input";

export function ResetRequestForm() {
  const [state, action, pending] = useActionState(requestPasswordResetAction, null);
  const errors = state && !state.ok ? state.fieldErrors : undefined;
  return (
    <form action={action} onSubmit={keepFieldsOnSubmit(action)} className="space-y-4" noValidate>
      <Field label="E-mail" htmlFor="email" error={errors?.email?.[0]}>
        <Input id="email" name="email" type="email" autoComplete="email" required aria-invalid={Boolean(errors?.email)} />
      </Field>
      <FormMessage>{state && !state.ok && !errors ? state.message : undefined}</FormMessage>
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? "Sending…" : "E-mail me a reset link"}
      </Button>
    </form>
  );
}
