/** Helpers for server actions that read a posted form. */

/** One field of a posted form; anything that is not a form (a scripted call) reads as missing. */
export const formField = (formData: unknown, name: string) => (formData instanceof FormData ? formData.get(name) : undefined);

/** zod issues by top-level field name ("form" for the whole form), as the forms show them. */
export function fieldErrorsOf(error: { issues: { path: PropertyKey[]; message: string }[] }): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) (out[String(issue.path[0] ?? "form")] ??= []).push(issue.message);
  return out;
}
