"use client";

import Link from "next/link";
import { useActionState, useState } from "react";
import { requestMagicLink, signInWithPassword } from "@/app/(auth)/actions";
import { keepFieldsOnSubmit } from "@/components/auth/use-kept-form";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input } from "@/components/ui/input";

export function SignInForm({ callbackUrl }: { callbackUrl?: string }) {
  const [state, action, pending] = useActionState(signInWithPassword, null);
  const [linkState, linkAction, linkPending] = useActionState(requestMagicLink, null);
  // Controlled, so the second step (the code) keeps what was typed in the first.
  const [email, setEmail] = useState("");
  const [password, setPassword] = useState("");
  const [startedOver, setStartedOver] = useState<unknown>(null);
  const askCode = Boolean(state && !state.ok && (state.code === "unauthenticated:code_required" || state.code === "unauthenticated:code_invalid") && startedOver !== state);
  const errors = state && !state.ok ? state.fieldErrors : undefined;
  const linkErrors = linkState && !linkState.ok ? linkState.fieldErrors : undefined;

  return (
    <div className="space-y-8">
      <form action={action} onSubmit={keepFieldsOnSubmit(action)} className="space-y-4" noValidate>
        <input type="hidden" name="callbackUrl" value={callbackUrl ?? ""} />
        {askCode ? (
          <>
            <input type="hidden" name="email" value={email} />
            <input type="hidden" name="password" value={password} />
            <p className="text-sm text-ink-600">
              Signing in as <span className="font-medium text-ink-800">{email}</span>.{" "}
              <button type="button" className="font-medium text-kiln-700 underline" onClick={() => setStartedOver(state)}>
                Use another account
              </button>
            </p>
            <Field label="Code" htmlFor="code" error={errors?.code?.[0]} hint="Six digits from your authenticator app, or a recovery code.">
              <Input
                id="code"
                name="code"
                autoComplete="one-time-code"
                inputMode="text"
                autoFocus
                required
                maxLength={40}
                aria-invalid={Boolean(errors?.code)}
                aria-describedby={errors?.code ? "code-error" : undefined}
              />
            </Field>
            <FormMessage tone={state && !state.ok && state.code === "unauthenticated:code_required" ? "ok" : "error"}>
              {state && !state.ok && !errors ? state.message : undefined}
            </FormMessage>
          </>
        ) : (
          <>
            <Field label="E-mail" htmlFor="email" error={errors?.email?.[0]}>
              <Input id="email" name="email" type="email" autoComplete="email" required value={email} onChange={(e) => setEmail(e.target.value)} aria-invalid={Boolean(errors?.email)} />
            </Field>
            <Field label="Password" htmlFor="password" error={errors?.password?.[0]}>
              <Input
                id="password"
                name="password"
                type="password"
                autoComplete="current-password"
                required
                value={password}
                onChange={(e) => setPassword(e.target.value)}
                aria-invalid={Boolean(errors?.password)}
              />
            </Field>
            <FormMessage>{state && !state.ok && !errors && !askCode && state.code !== "unauthenticated:code_required" && state.code !== "unauthenticated:code_invalid" ? state.message : undefined}</FormMessage>
          </>
        )}
        <Button type="submit" className="w-full" disabled={pending}>
          {pending ? "Signing in…" : "Sign in"}
        </Button>
        <p className="text-right text-sm">
          <Link href="/reset" className="font-medium text-kiln-700 underline">
            Forgot your password?
          </Link>
        </p>
      </form>

      <div className="flex items-center gap-3 text-xs uppercase tracking-wide text-ink-400">
        <span className="h-px flex-1 bg-paper-300" /> or get a link by e-mail <span className="h-px flex-1 bg-paper-300" />
      </div>

      <form action={linkAction} onSubmit={keepFieldsOnSubmit(linkAction)} className="space-y-3" noValidate>
        <Field label="E-mail for a sign-in link" htmlFor="link-email" error={linkErrors?.email?.[0]} hint="Not for accounts that sign in with a code.">
          <Input id="link-email" name="email" type="email" autoComplete="email" aria-invalid={Boolean(linkErrors?.email)} />
        </Field>
        <Button type="submit" variant="secondary" className="w-full" disabled={linkPending}>
          {linkPending ? "Sending…" : "E-mail me a sign-in link"}
        </Button>
      </form>
    </div>
  );
}
