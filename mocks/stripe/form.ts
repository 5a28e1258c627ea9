/**
 * Stripe's request encoding: application/x-www-form-urlencoded with bracketed nested keys, e.g.
 * `metadata[orderId]=o_1` and `line_items[0][price_data][unit_amount]=5000`. Numeric segments
 * build arrays; everything stays a string, as on the wire.
 */
export type FormValue = string | FormValue[] | { [key: string]: FormValue };
export type FormObject = { [key: string]: FormValue };

export function parseStripeForm(encoded: string): FormObject {
  const root: FormObject = {};
  for (const [rawKey, value] of new URLSearchParams(encoded)) {
    const segments = splitKey(rawKey);
    if (segments.length === 0) continue;
    let node: FormObject | FormValue[] = root;
    for (let i = 0; i < segments.length; i += 1) {
      const seg = segments[i]!;
      const isLast = i === segments.length - 1;
      const nextIsIndex = !isLast && /^\d*$/.test(segments[i + 1]!);
      if (Array.isArray(node)) {
        const index = seg === "" ? node.length : Number(seg);
        if (isLast) node[index] = value;
        else {
          node[index] ??= nextIsIndex ? [] : {};
          node = node[index] as FormObject | FormValue[];
        }
      } else {
        if (isLast) node[seg] = value;
        else {
          node[seg] ??= nextIsIndex ? [] : {};
          node = node[seg] as FormObject | FormValue[];
        }
      }
    }
  }
  return root;
}

function splitKey(key: string): string[] {
  const first = key.indexOf("[");
  if (first === -1) return [key];
  const out = [key.slice(0, first)];
  const re = /\[([^\]]*)\]/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(key.slice(first))) !== null) out.push(m[1]!);
  return out;
}

export function str(v: FormValue | undefined): string | undefined {
  return typeof v === "string" ? v : undefined;
}

export function obj(v: FormValue | undefined): FormObject | undefined {
  return v && typeof v === "object" && !Array.isArray(v) ? v : undefined;
}

export function arr(v: FormValue | undefined): FormValue[] | undefined {
  if (Array.isArray(v)) return v.filter((x) => x !== undefined);
  const o = obj(v);
  // Some clients send `items[0]` keys that arrive as an object keyed by index.
  if (o && Object.keys(o).every((k) => /^\d+$/.test(k))) return Object.values(o);
  return undefined;
}

/** Metadata is string → string; Stripe drops keys sent with an empty value. */
export function metadataOf(v: FormValue | undefined): Record<string, string> {
  const o = obj(v) ?? {};
  const out: Record<string, string> = {};
  for (const [k, val] of Object.entries(o)) if (typeof val === "string" && val !== "") out[k] = val;
  return out;
}
