"use client";

import { useActionState } from "react";
import { acceptInvitationAction } from "@/app/(auth)/invite/actions";
import { keepFieldsOnSubmit } from "@/components/auth/use-kept-form";
import { NewPasswordFields } from "@/components/auth/new-password-fields";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input } from "@/components/ui/input";

export function AcceptInvitationForm({ token, email }: { token: string; email: string }) {
  const [state, action, pending] = useActionState(acceptInvitationAction, null);
  const errors = state && !state.ok ? state.fieldErrors : undefined;
  return (
    <form action={action} onSubmit={keepFieldsOnSubmit(action)} className="space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <div className="rounded bg-paper-100 px-3 py-2 text-sm">
        <p className="text-xs text-ink-500">You sign in with</p>
        <p className="break-all font-medium text-ink-800">{email}</p>
        {/* For password managers: the account the new password belongs to. */}
        <input type="email" name="username" value={email} autoComplete="username" readOnly hidden />
      </div>
      <Field label="Your name" htmlFor="name" error={errors?.name?.[0]} hint="Shown to clients beside your messages.">
        <Input id="name" name="name" autoComplete="name" aria-invalid={Boolean(errors?.name)} />
      </Field>
      <NewPasswordFields label="Password" errors={errors} />
      <FormMessage>{state && !state.ok && !errors ? state.message : undefined}</FormMessage>
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? "Saving…" : "Accept and set password"}
      </Button>
    </form>
  );
}
