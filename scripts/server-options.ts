/**
 * V8 options for the process that runs `next start` (the demo, the tests' and benchmarks' servers,
 * and `npm start`, whose package.json line repeats them: tests/unit/build/server-options.test.ts
 * keeps the two equal).
 *
 * Every page render allocates several MB of short-lived objects (the React tree, its serialised
 * payload, the HTML). With V8's default young generation (semi-spaces that grow to 16 MB — from
 * memory of V8's heap sizing, not measured) the garbage collector ran in 11 % of the server's CPU
 * profile; 64 MB semi-spaces mean fewer scavenges and fewer objects promoted to the old generation.
 * Measured on the technique page (`npm run bench -- technique-page`, DEVELOPERS.md "Under load", fourth pass),
 * at the cost of up to 3 × 64 MB more memory for the young generation.
 */
export const SERVER_V8_OPTIONS = ["--max-semi-space-size=64"] as const;

/** NODE_OPTIONS for the server: the caller's own (if any) and ours. */
export function serverNodeOptions(existing?: string): string {
  return [existing, ...SERVER_V8_OPTIONS].filter(Boolean).join(" ");
}
