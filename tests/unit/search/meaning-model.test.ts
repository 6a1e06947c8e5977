import { mkdtemp, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";

import { describe, expect, it, vi } from "vitest";

import { startEncoderWorker } from "@/lib/search/meaning-model";

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
