/** @type {import('next').NextConfig} */
const nextConfig = {
  serverExternalPackages: [
    "@mikro-orm/core",
    "@mikro-orm/knex",
    "@mikro-orm/postgresql",
    "@mikro-orm/migrations",
    "sharp",
    "pg-boss",
  ],
  poweredByHeader: false,
  // The build checks the app's own code; tests and scripts are checked by `npm run typecheck`.
  typescript: { tsconfigPath: "tsconfig.build.json" },
};
export default nextConfig;
