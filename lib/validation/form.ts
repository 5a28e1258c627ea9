/** Helpers for server actions that read a posted form. */

/** zod issues by top-level field name ("form" for the whole form), as the forms show them. */
export function fieldErrorsOf(error: { issues: { path: PropertyKey[]; message: string }[] }): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) (out[String(issue.path[0] ?? "form")] ??= []).push(issue.message);
  return out;
}

/**
 * zod issues by their whole path ("lines.3" for the fourth line's fields), so a form of repeated
 * rows can mark the row at fault; issues on the form as a whole go under "form".
 */
export function fieldErrorsByRow(error: { issues: { path: PropertyKey[]; message: string }[] }, depth = 2): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.slice(0, depth).map(String).join(".") || "form";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

/** Fields named `address.x` become `{ address: { x } }` (a form's nested group, e.g. sign-up's billing address). */
export function nestedFields(entries: unknown): unknown {
  if (!entries || typeof entries !== "object") return entries;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(entries)) {
    const dot = k.indexOf(".");
    if (dot > 0) ((out[k.slice(0, dot)] ??= {}) as Record<string, unknown>)[k.slice(dot + 1)] = v;
    else out[k] = v;
  }
  return out;
}
