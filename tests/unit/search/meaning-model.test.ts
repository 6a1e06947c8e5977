import { mkdir, mkdtemp, rm, writeFile } from "node:fs/promises";
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
      const encode = await startEncoderWorker(path.join(root, "package.json"));
      expect(encode).not.toBeNull();
      const [vector] = await (encode as NonNullable<typeof encode>)(["any text"], "query");
      expect(Array.from(vector ?? [])).toEqual([0.6, 0.8].map((x) => Math.fround(x)));
    } finally {
      await rm(root, { recursive: true, force: true });
    }
  });
});
