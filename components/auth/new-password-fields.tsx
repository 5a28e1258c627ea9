import { Field, Input } from "@/components/ui/input";

/** A new password and its confirmation, with the password rule's hint (sign-up by invitation, reset). */
export function NewPasswordFields({ label, errors }: { label: string; errors?: Partial<Record<string, string[]>> }) {
  return (
    <>
      <Field label={label} htmlFor="password" error={errors?.password?.[0]} hint="At least 10 characters, with a digit.">
        <Input id="password" name="password" type="password" autoComplete="new-password" aria-invalid={Boolean(errors?.password)} />
      </Field>
      <Field label={`${label} again`} htmlFor="confirm" error={errors?.confirm?.[0]}>
        <Input id="confirm" name="confirm" type="password" autoComplete="new-password" aria-invalid={Boolean(errors?.confirm)} />
      </Field>
    </>
  );
}
