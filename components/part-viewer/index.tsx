"use client";

import dynamic from "next/dynamic";
import { Skeleton } from "@/components/ui/card";
import type { PartViewerProps } from "./part-viewer";

/** three.js is loaded only where a preview is shown, and only in the browser. */
export const LazyPartViewer = dynamic<PartViewerProps>(() => import("./part-viewer").then((m) => m.PartViewer), {
  ssr: false,
  loading: () => <Skeleton className="h-72 w-full sm:h-96" />,
});
export type { PartViewerProps };
