"use client";

import { useActionState } from "react";
import { resetPasswordAction } from "@/app/(auth)/reset/actions";
import { keepFieldsOnSubmit } from "@/components/auth/use-kept-form";
import { NewPasswordFields } from "@/components/auth/new-password-fields";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/input";

export function ResetPasswordForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState(resetPasswordAction, null);
  const errors = state && !state.ok ? state.fieldErrors : undefined;
  return (
    <form action={action} onSubmit={keepFieldsOnSubmit(action)} className="space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <NewPasswordFields label="New password" errors={errors} />
      <FormMessage>{state && !state.ok && !errors ? state.message : undefined}</FormMessage>
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? "Saving…" : "Set new password"}
      </Button>
    </form>
  );
}
