/** @type {import('next').NextConfig} */
const nextConfig = {
  serverExternalPackages: ["knex", "mysql2", "@react-pdf/renderer", "exceljs", "bcryptjs", "@aws-sdk/client-s3", "nodemailer", "papaparse", "iconv-lite"],
  // NEXT_DIST_DIR lets parallel builds (e.g. a benchmark) use their own output folder.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  poweredByHeader: false,
  typedRoutes: false,
  experimental: { serverActions: { bodySizeLimit: "2mb" } },
};

export default nextConfig;
