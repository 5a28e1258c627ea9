export const root: string;
export const bundles: Record<"worker" | "cli", { entry: string; outfile: string }>;
export function isStale(name: "worker" | "cli"): boolean;
export function buildBundle(name: "worker" | "cli"): Promise<string>;
export function ensureBundle(name: "worker" | "cli"): Promise<string>;
