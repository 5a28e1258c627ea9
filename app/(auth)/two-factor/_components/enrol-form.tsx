"use client";

import Link from "next/link";
import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input } from "@/components/ui/input";
import { confirmTwoFactor } from "../actions";
import { RecoveryCodes } from "./recovery-codes";

/** Scan, type the first code, then keep the recovery codes (shown once). */
export function EnrolForm({ qrDataUrl, secret, next }: { qrDataUrl: string; secret: string; next: string }) {
  const [state, action, pending] = useActionState(confirmTwoFactor, null);
  if (state?.ok) {
    return (
      <div className="mt-6 space-y-4">
        <FormMessage tone="ok">The authenticator app is set up. From now on, sign-in asks for its code.</FormMessage>
        <RecoveryCodes codes={state.data.recoveryCodes} />
        <Link href={next} className="inline-block font-medium text-kiln-700 underline">
          I have kept them — continue
        </Link>
      </div>
    );
  }
  const errors = state && !state.ok ? state.fieldErrors : undefined;
  return (
    <div className="mt-6 space-y-5">
      <ol className="list-decimal space-y-4 pl-5 text-sm text-ink-700">
        <li>
          In an authenticator app on your phone, add an account by scanning this code.
          {/* A data: URL made on the server; next/image adds nothing for it. */}
          {/* eslint-disable-next-line @next/next/no-img-element */}
          <img src={qrDataUrl} alt="QR code to add Layerwright to an authenticator app" width={220} height={220} className="mt-3 rounded border border-paper-300 bg-white" />
          <span className="mt-2 block text-ink-500">
            Cannot scan? Type this key instead: <code className="break-all rounded bg-paper-100 px-1 font-mono text-ink-800">{secret.match(/.{1,4}/g)?.join(" ")}</code>
          </span>
        </li>
        <li>Enter the 6-digit code the app now shows.</li>
      </ol>
      <form action={action} className="space-y-4" noValidate>
        <Field label="Code from the app" htmlFor="code" error={errors?.code?.[0]}>
          <Input id="code" name="code" inputMode="numeric" autoComplete="one-time-code" maxLength={12} required aria-invalid={Boolean(errors?.code)} />
        </Field>
        <FormMessage>{state && !state.ok && !errors ? state.message : undefined}</FormMessage>
        <Button type="submit" className="w-full" disabled={pending}>
          {pending ? "Checking…" : "Turn on two-factor sign-in"}
        </Button>
      </form>
    </div>
  );
}
