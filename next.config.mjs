/** @type {import('next').NextConfig} */
const nextConfig = {
  // Sequelize loads its dialect with a dynamic require; keep it (and pg) out of the bundle.
  serverExternalPackages: ["sequelize", "pg", "pg-hstore", "pg-boss", "nodemailer", "smtp-server"],
  poweredByHeader: false,
  // No gzip in the app: a saved run's JSON is megabytes, and compressing it here cost more than sending
  // it (npm run bench). Compress at the reverse proxy when users are on slow links.
  compress: false,
  reactStrictMode: true,
};

export default nextConfig;
