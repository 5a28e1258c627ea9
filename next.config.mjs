/** @type {import('next').NextConfig} */
const nextConfig = {
  // Several builds can share one checkout (tests, helpers): each may pick its own output folder.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  poweredByHeader: false,
  serverExternalPackages: ["@libsql/client", "libsql", "occt-import-js", "manifold-3d"],
  experimental: {
    authInterrupts: true,
    serverActions: { bodySizeLimit: "2mb" },
  },
};

export default nextConfig;
