import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // The ORM loads dialect drivers dynamically; bundling it breaks resolution of drivers we don't use.
  serverExternalPackages: ["sequelize", "mariadb", "piscina", "smtp-server", "mailparser", "nodemailer", "pdfkit", "exceljs", "bullmq", "ioredis"],
  poweredByHeader: false,
};

export default nextConfig;
