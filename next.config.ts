import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // PGlite ships a WebAssembly build of PostgreSQL that must be loaded from node_modules, not bundled.
  serverExternalPackages: ["@electric-sql/pglite", "sharp", "@node-rs/argon2", "smtp-server", "nodemailer", "mailparser"],
  poweredByHeader: false,
  typedRoutes: false,
  experimental: {
    serverActions: { bodySizeLimit: "2mb" },
  },
};

export default nextConfig;
