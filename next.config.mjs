/** @type {import('next').NextConfig} */
const nextConfig = {
  serverExternalPackages: [
    "@mikro-orm/core",
    "@mikro-orm/knex",
    "@mikro-orm/postgresql",
    "@mikro-orm/migrations",
    "sharp",
  ],
  poweredByHeader: false,
};
export default nextConfig;
