import "server-only";
import { createHash } from "node:crypto";
import { mkdir, readFile, rename, writeFile } from "node:fs/promises";
import path from "node:path";
import { canonicalJson, type LabRunRequest, type StepReport } from "@/lib/lab/recipe";
import { LabAbortedError, runRecipe, type DecodeCache, type ProxyStill, type DenoisedLoader, type LabProgress } from "@/lib/lab/engine";
import type { LabColour } from "@/lib/stills/lab-source";

/*
 * Runs lab recipes with a result cache (memory LRU with a byte cap, then an on-disk folder)
 * and a bound on how many run at once, how many wait, and how long a run may take, so one
 * heavy render cannot starve the server. Errors are typed for the route handler:
 * LabBusyError → 429, LabTimeoutError → 503, LabInputError (engine) → 400.
 */

/** Bump when the engine's output for the same inputs changes, to retire old cache entries. */
export const LAB_ENGINE_VERSION = 1;

export class LabBusyError extends Error {
  readonly code = "rate_limited" as const;
  constructor() {
    super("the lab is busy; try again shortly");
    this.name = "LabBusyError";
  }
}

export class LabTimeoutError extends Error {
  readonly code = "timeout" as const;
  constructor(ms: number) {
    super(`the lab run took longer than ${Math.round(ms / 1000)} s`);
    this.name = "LabTimeoutError";
  }
}

export type LabRunInput = {
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
  key: string;
  cached: "memory" | "disk" | false;
};

export type LabRunnerOptions = {
  /** On-disk cache folder; no disk cache when absent. */
  cacheDir?: string;
  memoryCacheBytes?: number;
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

export type LabRunner = {
  run(input: LabRunInput): Promise<LabRunOutput>;
  stats(): { active: number; queued: number; memoryEntries: number; memoryBytes: number };
};

/** Disk cache writes in flight, by cache folder and key, across runners of this process. */
const pendingWrites = new Map<string, Promise<void>>();

export function createLabRunner(options: LabRunnerOptions = {}): LabRunner {
  const memCap = options.memoryCacheBytes ?? 256 * 1024 * 1024;
  const maxConcurrent = options.maxConcurrent ?? 2;
  const maxQueue = options.maxQueue ?? 8;
  const timeoutMs = options.timeoutMs ?? 60_000;
  const memory = new Map<string, { bytes: Buffer; meta: Meta }>();
  let memBytes = 0;
  let active = 0;
  const waiting: (() => void)[] = [];
  const inflight = new Map<string, Promise<LabRunOutput>>();
  // Decoded proxy stills as working-space floats plus 8-bit codes (≈ 8.3 MB each at 1024 × 540),
  // least recently used first out.
  const decoded = new Map<string, ProxyStill>();
  let decodedBytes = 0;
  const decodedCap = options.decodedCacheBytes ?? 128 * 1024 * 1024;
  const decodeCache: DecodeCache = {
    get(key) {
      const v = decoded.get(key);
      if (v) {
        decoded.delete(key);
        decoded.set(key, v);
      }
      return v;
    },
    set(key, value) {
      const size = (v: ProxyStill): number => v.data.byteLength + (v.codes8?.byteLength ?? 0);
      if (decoded.has(key) || size(value) > decodedCap) return;
      decoded.set(key, value);
      decodedBytes += size(value);
      for (const [k, v] of decoded) {
        if (decodedBytes <= decodedCap) break;
        decoded.delete(k);
        decodedBytes -= size(v);
      }
    },
  };

  function remember(key: string, bytes: Buffer, meta: Meta): void {
    if (bytes.length > memCap) return;
    memory.delete(key);
    memory.set(key, { bytes, meta });
    memBytes += bytes.length;
    for (const [k, v] of memory) {
      if (memBytes <= memCap) break;
      memory.delete(k);
      memBytes -= v.bytes.length;
    }
  }

  async function fromDisk(key: string): Promise<{ bytes: Buffer; meta: Meta } | null> {
    if (!options.cacheDir) return null;
    // A result still being written by this process is read once it is complete.
    await pendingWrites.get(path.join(/* turbopackIgnore: true */ options.cacheDir, key));
    try {
      const [bytes, metaText] = await Promise.all([
        readFile(path.join(options.cacheDir, `${key}.bin`)),
        readFile(path.join(options.cacheDir, `${key}.json`), "utf8"),
      ]);
      return { bytes, meta: JSON.parse(metaText) as Meta };
    } catch {
      return null;
    }
  }

  async function toDisk(key: string, bytes: Buffer, meta: Meta): Promise<void> {
    if (!options.cacheDir) return;
    await mkdir(options.cacheDir, { recursive: true });
    // Write then rename, so a reader never sees half a file; bytes before meta, since meta marks it complete.
    const tmp = `.${process.pid}-${Math.random().toString(36).slice(2)}`;
    const bin = path.join(options.cacheDir, `${key}.bin`), json = path.join(options.cacheDir, `${key}.json`);
    await writeFile(bin + tmp, bytes);
    await rename(bin + tmp, bin);
    await writeFile(json + tmp, JSON.stringify(meta));
    await rename(json + tmp, json);
  }

  async function acquire(deadline: number): Promise<void> {
    if (active < maxConcurrent) {
      active++;
      return;
    }
    if (waiting.length >= maxQueue) throw new LabBusyError();
    await new Promise<void>((resolve, reject) => {
      const grant = (): void => {
        clearTimeout(timer);
        active++;
        resolve();
      };
      const timer = setTimeout(() => {
        const i = waiting.indexOf(grant);
        if (i >= 0) waiting.splice(i, 1);
        reject(new LabTimeoutError(timeoutMs));
      }, Math.max(0, deadline - Date.now()));
      waiting.push(grant);
    });
  }

  function release(): void {
    active--;
    waiting.shift()?.();
  }

  async function compute(key: string, input: LabRunInput): Promise<LabRunOutput> {
    const deadline = Date.now() + timeoutMs;
    await acquire(deadline);
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
      const meta: Meta = { contentType: result.contentType, width: result.width, height: result.height, reports: result.reports, key };
      remember(key, result.bytes, meta);
      if (options.cacheDir) {
        // The answer does not wait for the disk copy (1–3 ms of file system calls per render, more
        // under load, which an interactive proxy render feels); readers in this process wait for it.
        const id = path.join(/* turbopackIgnore: true */ options.cacheDir, key);
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
    stats: () => ({ active, queued: waiting.length, memoryEntries: memory.size, memoryBytes: memBytes }),
  };
}

const globalForLab = globalThis as unknown as { plateroomLabRunners?: Map<string, LabRunner> };

/** Runs through a process-wide runner per cache folder (kept on globalThis across HMR). */
export function runLab(input: LabRunInput & { cacheDir?: string }): Promise<LabRunOutput> {
  const runners = (globalForLab.plateroomLabRunners ??= new Map());
  const id = input.cacheDir ?? "";
  let runner = runners.get(id);
  if (!runner) {
    runner = createLabRunner({ cacheDir: input.cacheDir });
    runners.set(id, runner);
  }
  return runner.run(input);
}
