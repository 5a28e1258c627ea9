"use client";

import { startTransition, type FormEvent } from "react";

/**
 * Submit a form to its action without React's reset of the form afterwards, so a refusal (a
 * taken e-mail, a wrong password, a field the server rejects) leaves every field as typed. The
 * form keeps `action={action}` too, for a browser without JavaScript.
 */
export function keepFieldsOnSubmit(action: (formData: FormData) => void) {
  return (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    startTransition(() => action(data));
  };
}
