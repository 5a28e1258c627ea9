"use client";

import { useCallback, useEffect, useState } from "react";

/** Fetch JSON from one of our admin routes; dates stay ISO strings. Refetches when the URL changes. */
export function useApi<T>(url: string | null) {
  const [tick, setTick] = useState(0);
  const key = url ? `${tick}|${url}` : null;
  const [state, setState] = useState<{ key: string | null; data?: T; error: string | null }>({ key: null, error: null });
  useEffect(() => {
    if (!url || !key) return;
    let live = true;
    fetch(url, { headers: { accept: "application/json" }, cache: "no-store" })
      .then(async (r) => {
        const body = await r.json().catch(() => null);
        if (!r.ok) throw new Error(body?.error?.message ?? `The server answered ${r.status}.`);
        return body as T;
      })
      .then((data) => live && setState({ key, data, error: null }))
      .catch((e: Error) => live && setState((s) => ({ key, data: s.data, error: e.message })));
    return () => {
      live = false;
    };
  }, [url, key]);
  const reload = useCallback(() => setTick((t) => t + 1), []);
  // Keep the last rows on screen while the next answer loads.
  return { data: state.data, error: state.key === key ? state.error : null, isLoading: Boolean(key) && state.key !== key, reload };
}
