/*
 * Compiles the still lab's WebAssembly text sources (lib/lab/wasm/*.wat) with wabt, the
 * WebAssembly Binary Toolkit's own compiler built for JavaScript. Shared by `npm run wasm`, which
 * writes the binaries the engine loads, and the test that checks they match their sources.
 */
import fs from "node:fs";
import path from "node:path";
import wabtInit from "wabt";

export const WASM_DIR = path.join(process.cwd(), "lib", "lab", "wasm");

/** The .wat sources, by module name ("gauss" for gauss.wat). */
export function watSources(dir = WASM_DIR): string[] {
  return fs.readdirSync(dir).filter((f) => f.endsWith(".wat")).map((f) => f.slice(0, -4)).sort();
}

/** The binary for one text source: validated, no names section, so the output depends on the code alone. */
export async function compileWat(name: string, source: string): Promise<Uint8Array> {
  const wabt = await wabtInit();
  const mod = wabt.parseWat(`${name}.wat`, source, { simd: true, bulk_memory: true });
  try {
    mod.resolveNames();
    mod.validate();
    return mod.toBinary({ write_debug_names: false, canonicalize_lebs: true }).buffer;
  } finally {
    mod.destroy();
  }
}
