"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input } from "@/components/ui/input";
import { renewRecoveryCodes, turnOffTwoFactor } from "../actions";
import { RecoveryCodes } from "./recovery-codes";

/** New recovery codes, or (clients only) turning the second factor off; both ask for a current code. */
export function ManageTwoFactor({ codesLeft, canTurnOff }: { codesLeft: number; canTurnOff: boolean }) {
  const [renewState, renewAction, renewPending] = useActionState(renewRecoveryCodes, null);
  const [offState, offAction, offPending] = useActionState(turnOffTwoFactor, null);
  if (offState?.ok) return <FormMessage tone="ok">Two-factor sign-in is off. Your password alone signs you in.</FormMessage>;
  const renewErrors = renewState && !renewState.ok ? renewState.fieldErrors : undefined;
  const offErrors = offState && !offState.ok ? offState.fieldErrors : undefined;
  return (
    <div className="mt-6 space-y-6">
      {renewState?.ok ? (
        <RecoveryCodes codes={renewState.data.recoveryCodes} />
      ) : (
        <form action={renewAction} className="space-y-3" noValidate>
          <p className="text-sm text-ink-600">
            {codesLeft} of 10 recovery codes unused.{codesLeft <= 3 ? " Make new ones before you run out." : ""}
          </p>
          <Field label="Code from the app" htmlFor="renew-code" error={renewErrors?.code?.[0]}>
            <Input id="renew-code" name="code" inputMode="numeric" autoComplete="one-time-code" maxLength={12} aria-invalid={Boolean(renewErrors?.code)} />
          </Field>
          <FormMessage>{renewState && !renewState.ok && !renewErrors ? renewState.message : undefined}</FormMessage>
          <Button type="submit" variant="secondary" disabled={renewPending}>
            Make new recovery codes
          </Button>
        </form>
      )}
      {canTurnOff ? (
        <form action={offAction} className="space-y-3 border-t border-paper-300 pt-6" noValidate>
          <Field label="Code from the app, to turn it off" htmlFor="off-code" error={offErrors?.code?.[0]}>
            <Input id="off-code" name="code" inputMode="numeric" autoComplete="one-time-code" maxLength={12} aria-invalid={Boolean(offErrors?.code)} />
          </Field>
          <FormMessage>{offState && !offState.ok && !offErrors ? offState.message : undefined}</FormMessage>
          <Button type="submit" variant="danger" disabled={offPending}>
            Turn off two-factor sign-in
          </Button>
        </form>
      ) : null}
    </div>
  );
}
