import { mkdtempSync, readdirSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import sharp from "sharp";
import { afterAll, describe, expect, it } from "vitest";
import { labRunRequestSchema } from "@/lib/lab/recipe";
import { createLabLimiter } from "@/lib/lab/limiter";
import { createLabRunner, labCacheKey, LabBusyError, LabTimeoutError } from "@/lib/lab/runner";

const dir = mkdtempSync(path.join(os.tmpdir(), "lab-runner-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function still(w = 64, h = 32) {
  const u = new Uint16Array(w * h * 3).map((_, i) => (i * 977) % 65536);
  return sharp(u, { raw: { width: w, height: h, channels: 3 } }).toColourspace("rgb16").png().toBuffer();
}
const request = labRunRequestSchema.parse({ still: "s1", steps: [{ op: "matrix", m: [[0.9, 0.1, 0], [0, 1, 0], [0, 0, 1]] }] });

describe("lab runner", () => {
  it("keys the cache by still, recipe, space, format and width, not by key order", () => {
    const k = labCacheKey("aa", request);
    expect(labCacheKey("aa", { ...request })).toBe(k);
    expect(labCacheKey("ab", request)).not.toBe(k);
    expect(labCacheKey("aa", { ...request, space: "stored" })).not.toBe(k);
    expect(labCacheKey("aa", { ...request, format: "webp" })).not.toBe(k);
    expect(labCacheKey("aa", { ...request, width: 32 })).not.toBe(k);
  });

  it("serves a re-run from memory, and a fresh runner from the disk cache, with the same bytes", async () => {
    const bytes = await still();
    const cacheDir = path.join(dir, "c1");
    const runner = createLabRunner({ cacheDir });
    const first = await runner.run({ stillBytes: bytes, stillSha256: "h1", request });
    expect(first.cached).toBe(false);
    // How fast a cached re-run answers is a benchmark row (bench/lab.ts "cached re-run"), not a test.
    const again = await runner.run({ stillBytes: bytes, stillSha256: "h1", request });
    expect(again.cached).toBe("memory");
    expect(Buffer.compare(again.bytes, first.bytes)).toBe(0);
    const fresh = await createLabRunner({ cacheDir }).run({ stillBytes: bytes, stillSha256: "h1", request });
    expect(fresh.cached).toBe("disk");
    expect(Buffer.compare(fresh.bytes, first.bytes)).toBe(0);
    expect(readdirSync(cacheDir).sort()).toEqual([`${first.key}.bin`, `${first.key}.json`]);
  });

  it("refuses work beyond the queue with LabBusyError (→ 429)", async () => {
    const bytes = await still(256, 256);
    const runner = createLabRunner({ maxConcurrent: 1, maxQueue: 1 });
    const runs = [0, 1, 2, 3].map((i) => runner.run({ stillBytes: bytes, stillSha256: `busy-${i}`, request }));
    const settled = await Promise.allSettled(runs);
    const rejected = settled.filter((s) => s.status === "rejected");
    expect(rejected.length).toBe(2);
    for (const r of rejected) expect(r.reason).toBeInstanceOf(LabBusyError);
  });

  it("times out a run that takes too long with LabTimeoutError (→ 503)", async () => {
    const bytes = await still(1024, 512);
    const runner = createLabRunner({ timeoutMs: 1 });
    const heavy = labRunRequestSchema.parse({ still: "x", steps: [{ op: "soften", sigma: 3, target: "g" }, { op: "soften", sigma: 3, target: "r" }] });
    await expect(runner.run({ stillBytes: bytes, stillSha256: "slow", request: heavy })).rejects.toBeInstanceOf(LabTimeoutError);
  });

  it("keeps results within its byte cap, least recently used out first", async () => {
    const bytes = await still();
    const runner = createLabRunner({});
    const first = await runner.run({ stillBytes: bytes, stillSha256: "cap-0", request });
    const size = first.bytes.length;
    const small = createLabRunner({ memoryCacheBytes: size * 2 + 1 });
    for (const i of [0, 1, 2]) await small.run({ stillBytes: bytes, stillSha256: `cap-${i}`, request });
    expect(small.stats().memoryEntries).toBe(2);
    expect(small.stats().memoryBytes).toBe(size * 2);
    expect((await small.run({ stillBytes: bytes, stillSha256: "cap-2", request })).cached).toBe("memory");
    expect((await small.run({ stillBytes: bytes, stillSha256: "cap-0", request })).cached).toBe(false);
  });

  it("runners sharing one limiter share its bound", async () => {
    const bytes = await still(256, 256);
    const limiter = createLabLimiter({ maxConcurrent: 1, maxQueue: 1 });
    const a = createLabRunner({ limiter }), b = createLabRunner({ limiter });
    const settled = await Promise.allSettled([0, 1, 2].map((i) => (i % 2 ? b : a).run({ stillBytes: bytes, stillSha256: `shared-${i}`, request })));
    expect(settled.filter((s) => s.status === "rejected").map((s) => (s).reason)).toEqual([expect.any(LabBusyError)]);
  });

  it("shares one computation between identical requests in flight", async () => {
    const bytes = await still();
    const runner = createLabRunner({});
    const [a, b] = await Promise.all([
      runner.run({ stillBytes: bytes, stillSha256: "same", request }),
      runner.run({ stillBytes: bytes, stillSha256: "same", request }),
    ]);
    expect(a).toBe(b);
  });
});
