import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // Lets parallel test runs keep separate builds (tests/e2e/harness.ts); the default is .next.
  distDir: process.env.PLATEROOM_DIST_DIR || ".next",
  // PGlite ships a WebAssembly build of PostgreSQL that must be loaded from node_modules, not bundled.
  serverExternalPackages: ["@electric-sql/pglite", "sharp", "@node-rs/argon2", "smtp-server", "nodemailer", "mailparser"],
  poweredByHeader: false,
  typedRoutes: false,
  experimental: {
    serverActions: { bodySizeLimit: "2mb" },
  },
};

export default nextConfig;
