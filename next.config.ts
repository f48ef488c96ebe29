import type { NextConfig } from "next";
import { API_CSP, STATIC_SECURITY_HEADERS } from "./lib/security/headers";

const nextConfig: NextConfig = {
  // The ORM loads dialect drivers dynamically; bundling it breaks resolution of drivers we don't use.
  serverExternalPackages: ["sequelize", "mariadb", "piscina", "smtp-server", "mailparser", "nodemailer", "pdfkit", "exceljs", "bullmq", "ioredis"],
  poweredByHeader: false,
  // Security headers on every answer; pages get their nonce CSP from proxy.ts, API answers a no-content one.
  async headers() {
    return [
      { source: "/:path*", headers: STATIC_SECURITY_HEADERS },
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: API_CSP }] },
    ];
  },
};

export default nextConfig;
