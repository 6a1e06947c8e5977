import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { blurExact, exactBlurCounts } from "@/lib/lab/gaussian";
import { matrixInPlace } from "@/lib/lab/kernels";
import { allocSimdRgb, isSimdRgb, matrixSimd, takeSimdRgb } from "@/lib/lab/simd";
import { compileLabWasm, labWasmModule, type LabWasmName } from "@/lib/lab/wasm/modules";
import { compileWat, WASM_DIR, watSources } from "@/scripts/lib/wat";

describe("the lab's WebAssembly binaries", () => {
  it("are exactly what wabt compiles from their .wat sources (run `npm run wasm` after editing one)", async () => {
    const names = watSources();
    expect(names).toEqual(["fft", "gauss", "matrix", "quant8"]);
    // Every binary has its source.
    expect(readdirSync(WASM_DIR).filter((f) => f.endsWith(".wasm")).sort()).toEqual(names.map((n) => `${n}.wasm`));
    for (const name of names) {
      const built = await compileWat(name, readFileSync(path.join(WASM_DIR, `${name}.wat`), "utf8"));
      const committed = readFileSync(path.join(WASM_DIR, `${name}.wasm`));
      expect(Buffer.compare(Buffer.from(built), committed), `${name}.wasm differs from ${name}.wat`).toBe(0);
    }
  });

  it("a corrupted binary fails loudly, naming the module, instead of leaving a JavaScript path to answer", () => {
    const broken = Uint8Array.from(readFileSync(path.join(WASM_DIR, "matrix.wasm")));
    broken[broken.length - 3] = 0xff; // inside the code section
    expect(() => compileLabWasm("matrix", () => broken)).toThrow(/matrix\.wasm could not be loaded/);
    expect(() => compileLabWasm("gauss", () => new Uint8Array(0))).toThrow(/gauss\.wasm could not be loaded/);
    for (const name of ["fft", "gauss", "matrix", "quant8"] as LabWasmName[]) expect(labWasmModule(name)).toBeInstanceOf(WebAssembly.Module);
  });
});

describe("the engine's hot paths run in WebAssembly (a silent fall back to JavaScript fails here)", () => {
  it("working buffers live in WebAssembly memory and the colour matrix runs there", () => {
    const a = takeSimdRgb(3 * 64);
    expect(isSimdRgb(a)).toBe(true);
    expect(matrixSimd(allocSimdRgb(12), [[1, 0, 0], [0, 2, 0], [0, 0, 1]], [0, 0, 0], [true, false, true])).toBe(true);
    // And it computes: the same matrix on a WebAssembly buffer and on a plain array.
    const wasm = allocSimdRgb(3 * 5), plain = new Float32Array(3 * 5);
    for (let i = 0; i < 15; i++) wasm[i] = plain[i] = (i * 37) % 11 / 10;
    const m = [[0.5, 0.25, 0], [0, 1, 0.5], [0.1, 0, 2]];
    matrixInPlace(wasm, m, [0.1, 0, -0.1]);
    matrixInPlace(plain, m, [0.1, 0, -0.1]);
    for (let i = 0; i < 15; i++) expect(wasm[i]).toBeCloseTo(plain[i]!, 6);
  });

  it("the exact blur runs its direct and FFT passes in WebAssembly", () => {
    const before = exactBlurCounts();
    const plane = new Float32Array(64 * 48).map((_, i) => (i % 7) / 7);
    blurExact(plane, 64, 48, 2, "direct");
    blurExact(plane, 64, 48, 2, "fft");
    const after = exactBlurCounts();
    expect(after.direct - before.direct).toBe(1);
    expect(after.fft - before.fft).toBe(1);
    expect(after.definition).toBe(before.definition);
  });
});
