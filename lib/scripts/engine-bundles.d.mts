export type BundleName = "worker" | "cli" | "slicer";
export const root: string;
export const bundles: Record<BundleName, { entry: string; outfile: string; with?: BundleName[] }>;
export function isStale(name: BundleName): boolean;
export function buildBundle(name: BundleName): Promise<string>;
export function ensureBundle(name: BundleName): Promise<string>;
