import "server-only";
import { readFileSync } from "node:fs";

/*
 * The lab's WebAssembly modules, compiled once per process from the committed binaries beside this
 * file (built from the .wat sources by `npm run wasm`). There is no JavaScript stand-in: a binary
 * that is missing or does not compile fails every run that needs it, loudly, rather than letting a
 * slower or different code path answer in its place.
 */

export type LabWasmName = "gauss" | "fft" | "matrix" | "quant8";

// One literal URL per module, so the build's file tracing sees exactly which files are needed.
const BINARIES: Record<LabWasmName, () => Uint8Array> = {
  gauss: () => readFileSync(new URL("./gauss.wasm", import.meta.url)),
  fft: () => readFileSync(new URL("./fft.wasm", import.meta.url)),
  matrix: () => readFileSync(new URL("./matrix.wasm", import.meta.url)),
  quant8: () => readFileSync(new URL("./quant8.wasm", import.meta.url)),
};

const compiled = new Map<LabWasmName, WebAssembly.Module>();

/** Compiles one module's bytes; throws, naming the module, when they are not a valid module. */
export function compileLabWasm(name: LabWasmName, bytes: () => Uint8Array): WebAssembly.Module {
  try {
    return new WebAssembly.Module(bytes() as Uint8Array<ArrayBuffer>);
  } catch (cause) {
    throw new Error(`the lab's WebAssembly module ${name}.wasm could not be loaded: ${(cause as Error).message}`, { cause });
  }
}

/** The compiled module; throws (with the module's name) when its binary is missing or invalid. */
export function labWasmModule(name: LabWasmName): WebAssembly.Module {
  let mod = compiled.get(name);
  if (!mod) {
    mod = compileLabWasm(name, BINARIES[name]);
    compiled.set(name, mod);
  }
  return mod;
}

/** Instantiates a module on a memory the caller owns (every lab module imports its memory as e.m). */
export function labWasmInstance<T>(name: LabWasmName, memory: WebAssembly.Memory): T {
  return new WebAssembly.Instance(labWasmModule(name), { e: { m: memory } }).exports as T;
}
