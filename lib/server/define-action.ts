import "server-only";
import { unstable_rethrow } from "next/navigation";
import type { z } from "zod";
import { getDb, type Db } from "@/db/client";
import { AppError, toActionError, type ActionResult } from "@/lib/errors";
import { enter, type Access, type UserFor } from "./access";

/** What a form-bound action (`useActionState`) keeps between posts: nothing yet, or the last result. */
export type FormResult<T = undefined> = ActionResult<T> | null;

/** What the input's field errors become: each issue under its path ("parts.0.file"), "form" for the whole input. */
export function fieldErrorsByPath(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) (out[issue.path.map(String).join(".") || "form"] ??= []).push(issue.message);
  return out;
}

/**
 * For an action fed by a generic form (any field may be missing or a string): callers may pass
 * any record; the schema still decides what is valid.
 */
export const anyRecord = <S extends z.ZodType>(schema: S) => schema as unknown as z.ZodType<z.output<S>, Record<string, unknown>>;

/**
 * What callers may send: the input's shape with its literal choices widened ("on_hold" → string),
 * since the schema, not the caller's types, decides what is valid.
 */
export type Loose<T> = T extends string ? string : T extends number ? number : T extends boolean ? boolean : T extends Date ? T : T extends object ? { [K in keyof T]: Loose<T[K]> } : T;

interface ActionSpec<A extends Access, S extends z.ZodType> {
  /** Who may call it (lib/server/access.ts). */
  access: A;
  /** The input, parsed after the guard (a caller refused at the door learns nothing of its shape). */
  input: S;
  /**
   * When the input does not parse: the form message (field errors by path), or the whole refusal.
   * Default: "Check the highlighted fields."
   */
  invalid?: string | ((error: z.ZodError, raw: unknown) => AppError);
}

export interface ActionContext<A extends Access> {
  user: UserFor<A>;
  db: Db;
}

type Handler<A extends Access, S extends z.ZodType, T> = (input: z.output<S>, ctx: ActionContext<A>) => Promise<T>;

function refusal(spec: { invalid?: ActionSpec<Access, z.ZodType>["invalid"] }, error: z.ZodError, raw: unknown): AppError {
  if (typeof spec.invalid === "function") return spec.invalid(error, raw);
  return new AppError("invalid_input", spec.invalid ?? "Check the highlighted fields.", fieldErrorsByPath(error));
}

async function run<A extends Access, S extends z.ZodType, T>(spec: ActionSpec<A, S>, handler: Handler<A, S, T>, raw: unknown): Promise<ActionResult<T>> {
  try {
    const user = await enter(spec.access);
    const parsed = spec.input.safeParse(raw);
    if (!parsed.success) throw refusal(spec, parsed.error, raw);
    return { ok: true, data: await handler(parsed.data, { user, db: getDb() }) };
  } catch (e) {
    // redirect(), notFound() and the like are Next's control flow, not failures.
    unstable_rethrow(e);
    return toActionError(e);
  }
}

/**
 * The one shape of a server action: guard (`access`) → parse (`input`) → the handler with the
 * parsed input, the user and the database → `{ ok: true, data }`; an AppError (or a bad input)
 * becomes `{ ok: false, code, message, fieldErrors }`, anything else is logged and answered plainly.
 *
 *     export const saveQuote = defineAction({ access: "quote:manage", input: saveQuoteSchema }, async (input, { user, db }) => { … });
 */
export function defineAction<A extends Access, S extends z.ZodType, T>(spec: ActionSpec<A, S>, handler: Handler<A, S, T>): (input: Loose<z.input<S>>) => Promise<ActionResult<T>> {
  return (input) => run(spec, handler, input);
}

/**
 * The same for an action bound to a `<form>` through `useActionState`: it reads the posted fields
 * (anything that is not a form reads as empty) and answers `null`-able form results. A handler
 * that succeeds usually redirects; returning nothing answers `{ ok: true }`.
 */
export function defineFormAction<A extends Access, S extends z.ZodType, T = undefined>(spec: ActionSpec<A, S>, handler: Handler<A, S, T | void>): (prev: FormResult<T>, formData: FormData) => Promise<FormResult<T>> {
  return (_prev, formData) => run(spec, handler as Handler<A, S, T>, formData instanceof FormData ? Object.fromEntries(formData) : {});
}
