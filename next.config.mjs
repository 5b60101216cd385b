// Headers for every response, pages and API alike (tests/e2e/security-headers.spec.ts checks them).
export const COMMON_SECURITY_HEADERS = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=()" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  serverExternalPackages: [
    "knex",
    "mysql2",
    "@react-pdf/renderer",
    "exceljs",
    "bcryptjs",
    "@aws-sdk/client-s3",
    "nodemailer",
    "papaparse",
    "iconv-lite",
  ],
  // NEXT_DIST_DIR lets parallel builds (e.g. a benchmark) use their own output folder.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  poweredByHeader: false,
  typedRoutes: false,
  // Every answer, pages and API alike; the page CSP is set per request in proxy.ts (it needs a nonce).
  async headers() {
    return [
      { source: "/:path*", headers: COMMON_SECURITY_HEADERS },
      // API answers are data, never documents: nothing to run, nothing to frame.
      {
        source: "/api/:path*",
        headers: [{ key: "Content-Security-Policy", value: "default-src 'none'; frame-ancestors 'none'; sandbox" }],
      },
    ];
  },
  experimental: { serverActions: { bodySizeLimit: "2mb" } },
};

export default nextConfig;
