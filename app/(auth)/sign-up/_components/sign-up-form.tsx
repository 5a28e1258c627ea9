"use client";

import { useActionState, useState } from "react";
import { AddressFields, addressErrors, emptyAddress } from "@/components/portal/address-fields";
import { signUp } from "@/app/(auth)/actions";
import { keepFieldsOnSubmit } from "@/components/auth/use-kept-form";
import { Button } from "@/components/ui/button";
import { Field, FormMessage, Input, Select } from "@/components/ui/input";

export function SignUpForm() {
  const [state, action, pending] = useActionState(signUp, null);
  const errors = state && !state.ok ? state.fieldErrors : undefined;
  // Controlled so a refused post keeps what was typed (the form resets after an action).
  const [address, setAddress] = useState(emptyAddress("Main office"));
  return (
    <form action={action} onSubmit={keepFieldsOnSubmit(action)} className="space-y-4" noValidate>
      <Field label="Your name" htmlFor="name" error={errors?.name?.[0]}>
        <Input id="name" name="name" autoComplete="name" aria-invalid={Boolean(errors?.name)} />
      </Field>
      <Field label="Firm" htmlFor="firmName" error={errors?.firmName?.[0]} hint="You become your firm's lead and can invite colleagues.">
        <Input id="firmName" name="firmName" autoComplete="organization" aria-invalid={Boolean(errors?.firmName)} />
      </Field>
      <Field label="Work e-mail" htmlFor="email" error={errors?.email?.[0]}>
        <Input id="email" name="email" type="email" autoComplete="email" aria-invalid={Boolean(errors?.email)} />
      </Field>
      <Field label="Password" htmlFor="password" error={errors?.password?.[0]} hint="At least 10 characters, with a digit.">
        <Input id="password" name="password" type="password" autoComplete="new-password" aria-invalid={Boolean(errors?.password)} />
      </Field>
      <Field label="Units you work in" htmlFor="unitsPref">
        <Select id="unitsPref" name="unitsPref" defaultValue="mm">
          <option value="mm">Millimetres and kilograms</option>
          <option value="in">Inches and pounds</option>
        </Select>
      </Field>
      <fieldset className="space-y-3">
        <legend className="text-sm font-medium text-ink-700">Billing address</legend>
        <p className="text-xs text-ink-400">Printed on your quotes and invoices. You can add shipping addresses later.</p>
        <input type="hidden" name="address.label" value={address.label} />
        <AddressFields value={address} onChange={setAddress} errors={addressErrors(errors)} prefix="signup" namePrefix="address." withLabel={false} />
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" name="shipHere" defaultChecked className="accent-kiln-600" />
          Parts ship to this address too
        </label>
      </fieldset>
      <FormMessage>{state && !state.ok ? state.message : undefined}</FormMessage>
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? "Creating account…" : "Create account"}
      </Button>
    </form>
  );
}
