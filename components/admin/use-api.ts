"use client";

import { useCallback, useEffect, useState } from "react";

/** Fetch JSON from one of our admin routes; dates stay ISO strings. Refetches when the URL changes. */
export function useApi<T>(url: string | null) {
  const [data, setData] = useState<T | undefined>(undefined);
  const [error, setError] = useState<string | null>(null);
  const [isLoading, setLoading] = useState(Boolean(url));
  const [tick, setTick] = useState(0);
  useEffect(() => {
    if (!url) return;
    let live = true;
    setLoading(true);
    setError(null);
    fetch(url, { headers: { accept: "application/json" }, cache: "no-store" })
      .then(async (r) => {
        const body = await r.json().catch(() => null);
        if (!r.ok) throw new Error(body?.error?.message ?? `The server answered ${r.status}.`);
        return body as T;
      })
      .then((b) => live && setData(b))
      .catch((e: Error) => live && setError(e.message))
      .finally(() => live && setLoading(false));
    return () => {
      live = false;
    };
  }, [url, tick]);
  const reload = useCallback(() => setTick((t) => t + 1), []);
  return { data, error, isLoading, reload };
}
