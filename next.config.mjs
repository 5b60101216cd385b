/** @type {import('next').NextConfig} */
const nextConfig = {
  serverExternalPackages: ["knex", "mysql2", "@react-pdf/renderer", "exceljs", "bcryptjs", "@aws-sdk/client-s3", "nodemailer", "papaparse", "iconv-lite"],
  poweredByHeader: false,
  typedRoutes: false,
  experimental: { serverActions: { bodySizeLimit: "2mb" } },
};

export default nextConfig;
