/**
 * Security headers. The CSP is written into the build (Next reads `headers()` at build time), so
 * the upload ingest origin comes from the build's environment: a hosted ingest URL is allowed as
 * is; a loopback one or none (the local fake, whose port tests choose at run time) is allowed on
 * any loopback port. Next's own inline bootstrap scripts need 'unsafe-inline' without per-request
 * nonces; everything else is same-origin only.
 */
const LOOPBACK = ["http://127.0.0.1:*", "http://localhost:*"];

function ingestSources() {
  const raw = process.env.UPLOADTHING_INGEST_URL;
  // No ingest URL and no hosted token: the defaults point at the local fake (lib/env.ts).
  if (!raw) return process.env.UPLOADTHING_TOKEN ? ["https://*.ingest.uploadthing.com", "https://api.uploadthing.com"] : LOOPBACK;
  const url = new URL(raw);
  if (["127.0.0.1", "localhost", "[::1]"].includes(url.hostname)) return LOOPBACK;
  return [url.origin];
}

function contentSecurityPolicy() {
  const https = (process.env.APP_URL ?? "").startsWith("https://");
  const directives = [
    "default-src 'self'",
    "script-src 'self' 'unsafe-inline'",
    // Tailwind's runtime-free CSS is a file, but React, recharts and the viewer set inline styles.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    `connect-src 'self' ${ingestSources().join(" ")}`,
    "worker-src 'self' blob:",
    // The outbox shows e-mails in a sandboxed srcdoc frame; nothing else is framed.
    "frame-src 'self'",
    "frame-ancestors 'none'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    ...(https ? ["upgrade-insecure-requests"] : []),
  ];
  return directives.join("; ");
}

const securityHeaders = [
  { key: "Content-Security-Policy", value: contentSecurityPolicy() },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=(), interest-cohort=()" },
  ...((process.env.APP_URL ?? "").startsWith("https://") ? [{ key: "Strict-Transport-Security", value: "max-age=31536000; includeSubDomains" }] : []),
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Several builds can share one checkout (tests, helpers): each may pick its own output folder.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  poweredByHeader: false,
  async headers() {
    return [{ source: "/:path*", headers: securityHeaders }];
  },
  serverExternalPackages: ["@libsql/client", "libsql", "occt-import-js", "manifold-3d", "@react-pdf/renderer"],
  experimental: {
    authInterrupts: true,
    serverActions: { bodySizeLimit: "2mb" },
  },
};

export default nextConfig;
