import "server-only";
import { createHash } from "node:crypto";
import { mkdir, readFile, rename, writeFile } from "node:fs/promises";
import path from "node:path";
import { LRUCache } from "lru-cache";
import { canonicalJson, type LabRunRequest, type StepReport } from "@/lib/lab/recipe";
import { LabAbortedError, runRecipe, type DecodeCache, type ProxyStill, type DenoisedLoader, type LabProgress } from "@/lib/lab/engine";
import type { LabColour } from "@/lib/stills/lab-source";
import { createLabLimiter, labLimiter, LabTimeoutError, type LabLimiter } from "@/lib/lab/limiter";
import { MEMORY_BUDGET } from "@/lib/memory/budget";

export { LabBusyError, LabTimeoutError } from "@/lib/lab/limiter";

/*
 * Runs lab recipes with a result cache (memory LRU with a byte cap, then an on-disk folder)
 * under the lab's concurrency limiter (lib/lab/limiter.ts) and a bound on how long a run may
 * take. Errors are typed for the route handler: LabBusyError → 429, LabTimeoutError → 503,
 * LabInputError (engine) → 400, LabOverflowError (engine) → 422.
 */

/** Bump when the engine's output for the same inputs changes, to retire old cache entries. */
const LAB_ENGINE_VERSION = 2;

type LabRunInput = {
  stillBytes: Uint8Array;
  /** Hex sha256 of the still's stored bytes (its content address). */
  stillSha256: string;
  request: LabRunRequest;
  /** Colour spaces of the stills read (absent: sRGB-encoded); stillSha256 must then also name them. */
  colour?: LabColour;
  loadStill?: DenoisedLoader;
  onProgress?: (p: LabProgress) => void;
};

export type LabRunOutput = {
  bytes: Buffer;
  contentType: string;
  width: number;
  height: number;
  reports: StepReport[];
  /** A proxy render (resized, blurs approximated): see RunRecipeResult.approximate. */
  approximate: boolean;
  key: string;
  cached: "memory" | "disk" | false;
};

type LabRunnerOptions = {
  /** On-disk cache folder; no disk cache when absent. */
  cacheDir?: string;
  memoryCacheBytes?: number;
  /** The concurrency bound; a fresh one with these limits when absent (the app passes the shared one). */
  limiter?: LabLimiter;
  maxConcurrent?: number;
  maxQueue?: number;
  timeoutMs?: number;
  /** Byte cap of decoded proxy stills kept for re-renders. */
  decodedCacheBytes?: number;
};

type Meta = Omit<LabRunOutput, "bytes" | "cached">;

export function labCacheKey(stillSha256: string, request: LabRunRequest): string {
  const { steps, space, format, width, workingSpace, exr } = request;
  return createHash("sha256")
    .update(canonicalJson({ v: LAB_ENGINE_VERSION, still: stillSha256, steps, space, format, width: width ?? null, workingSpace, exr: format === "exr" ? exr : undefined }))
    .digest("hex");
}

/*
 * A file in the result cache folder. The folder is chosen at run time (inside the data folder) and
 * holds no source: the build's file tracing must not follow these paths (it would otherwise trace
 * the whole project into the lab routes).
 */
const cacheFile = (dir: string, name: string): string => path.join(/* turbopackIgnore: true */ dir, name);

type LabRunner = {
  run(input: LabRunInput): Promise<LabRunOutput>;
  stats(): { active: number; queued: number; memoryEntries: number; memoryBytes: number };
};

/** Disk cache writes in flight, by cache folder and key, across runners of this process. */
const pendingWrites = new Map<string, Promise<void>>();

export function createLabRunner(options: LabRunnerOptions = {}): LabRunner {
  const limiter = options.limiter ?? createLabLimiter({ maxConcurrent: options.maxConcurrent, maxQueue: options.maxQueue });
  const timeoutMs = options.timeoutMs ?? 60_000;
  // Encoded results; an entry larger than the whole cap is not kept.
  const memory = new LRUCache<string, { bytes: Buffer; meta: Meta }>({
    maxSize: options.memoryCacheBytes ?? MEMORY_BUDGET.labResults,
    sizeCalculation: (v) => Math.max(1, v.bytes.length),
  });
  const inflight = new Map<string, Promise<LabRunOutput>>();
  // Decoded proxy stills as working-space floats plus 8-bit codes (≈ 8.3 MB each at 1024 × 540).
  const decoded = new LRUCache<string, ProxyStill>({
    maxSize: options.decodedCacheBytes ?? MEMORY_BUDGET.labDecodedProxies,
    sizeCalculation: (v) => v.data.byteLength + (v.codes8?.byteLength ?? 0),
  });
  const decodeCache: DecodeCache = {
    get: (key) => decoded.get(key),
    set: (key, value) => {
      if (!decoded.has(key)) decoded.set(key, value);
    },
  };

  function remember(key: string, bytes: Buffer, meta: Meta): void {
    memory.set(key, { bytes, meta });
  }

  async function fromDisk(key: string): Promise<{ bytes: Buffer; meta: Meta } | null> {
    if (!options.cacheDir) return null;
    // A result still being written by this process is read once it is complete.
    await pendingWrites.get(cacheFile(options.cacheDir, key));
    try {
      const [bytes, metaText] = await Promise.all([
        readFile(cacheFile(options.cacheDir, `${key}.bin`)),
        readFile(cacheFile(options.cacheDir, `${key}.json`), "utf8"),
      ]);
      return { bytes, meta: JSON.parse(metaText) as Meta };
    } catch {
      return null;
    }
  }

  async function toDisk(key: string, bytes: Buffer, meta: Meta): Promise<void> {
    if (!options.cacheDir) return;
    await mkdir(/* turbopackIgnore: true */ options.cacheDir, { recursive: true });
    // Write then rename, so a reader never sees half a file; bytes before meta, since meta marks it complete.
    const tmp = `.${process.pid}-${Math.random().toString(36).slice(2)}`;
    const bin = cacheFile(options.cacheDir, `${key}.bin`), json = cacheFile(options.cacheDir, `${key}.json`);
    await writeFile(bin + tmp, bytes);
    await rename(bin + tmp, bin);
    await writeFile(json + tmp, JSON.stringify(meta));
    await rename(json + tmp, json);
  }

  async function compute(key: string, input: LabRunInput): Promise<LabRunOutput> {
    const deadline = Date.now() + timeoutMs;
    const release = await limiter.acquire(deadline, timeoutMs);
    const controller = new AbortController();
    const run = runRecipe({
      still: input.stillBytes,
      steps: input.request.steps,
      space: input.request.space,
      format: input.request.format,
      width: input.request.width,
      loadStill: input.loadStill,
      signal: controller.signal,
      onProgress: input.onProgress,
      decodeCache,
      plateKey: input.stillSha256,
      colour: input.colour,
      exr: input.request.exr,
    });
    // The slot is held until the run has really stopped, so the bound stays honest.
    run.then(release, release);
    let timer: NodeJS.Timeout | undefined;
    const timeout = new Promise<never>((_, reject) => {
      timer = setTimeout(() => {
        controller.abort();
        reject(new LabTimeoutError(timeoutMs));
      }, Math.max(0, deadline - Date.now()));
    });
    try {
      const result = await Promise.race([run, timeout]);
      const meta: Meta = {
        contentType: result.contentType, width: result.width, height: result.height, reports: result.reports, approximate: result.approximate, key,
      };
      remember(key, result.bytes, meta);
      if (options.cacheDir) {
        // The answer does not wait for the disk copy (1–3 ms of file system calls per render, more
        // under load, which an interactive proxy render feels); readers in this process wait for it.
        const id = cacheFile(options.cacheDir, key);
        const write = toDisk(key, result.bytes, meta).catch(() => undefined).finally(() => {
          if (pendingWrites.get(id) === write) pendingWrites.delete(id);
        });
        pendingWrites.set(id, write);
      }
      return { ...meta, bytes: result.bytes, cached: false };
    } catch (err) {
      if (err instanceof LabAbortedError) throw new LabTimeoutError(timeoutMs);
      throw err;
    } finally {
      clearTimeout(timer);
      run.catch(() => undefined);
    }
  }

  return {
    async run(input) {
      const key = labCacheKey(input.stillSha256, input.request);
      const hit = memory.get(key);
      if (hit) {
        memory.delete(key);
        memory.set(key, hit);
        return { ...hit.meta, bytes: hit.bytes, cached: "memory" };
      }
      const disk = await fromDisk(key);
      if (disk) {
        remember(key, disk.bytes, disk.meta);
        return { ...disk.meta, bytes: disk.bytes, cached: "disk" };
      }
      let pending = inflight.get(key);
      if (!pending) {
        pending = compute(key, input).finally(() => inflight.delete(key));
        inflight.set(key, pending);
      }
      return pending;
    },
    stats: () => ({ ...limiter.stats(), memoryEntries: memory.size, memoryBytes: memory.calculatedSize }),
  };
}

const globalForLab = globalThis as unknown as { plateroomLabRunners?: Map<string, LabRunner> };

/** Runs through a process-wide runner per cache folder (kept on globalThis across HMR). */
export function runLab(input: LabRunInput & { cacheDir?: string }): Promise<LabRunOutput> {
  const runners = (globalForLab.plateroomLabRunners ??= new Map());
  const id = input.cacheDir ?? "";
  let runner = runners.get(id);
  if (!runner) {
    runner = createLabRunner({ cacheDir: input.cacheDir, limiter: labLimiter() });
    runners.set(id, runner);
  }
  return runner.run(input);
}
