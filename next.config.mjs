/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize loads its dialect with a dynamic require; keep it (and pg) out of the bundle.
  serverExternalPackages: ["sequelize", "pg", "pg-hstore", "pg-boss", "nodemailer", "smtp-server"],
  poweredByHeader: false,
  reactStrictMode: true,
};

export default nextConfig;
