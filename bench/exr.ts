/*
 * OpenEXR benchmark (issue 17). Run: npx tsx -C react-server bench/exr.ts   [--quick: 2K only]
 * Decode of a 2048×1080 and a 4096×2160 half-float frame, ZIP and PIZ (the demo's generated
 * linear plate, encoded by three's EXRExporter), each beside a float RGB copy of the same frame
 * timed right before each repetition; the fastest repetition counts (interference on a shared
 * machine only adds time). Peak RSS of a 4K OpenEXR upload's file work (clean header, content
 * check with a full decode, previews and the full-size display image) in a child process; the
 * database row is not part of it. Writes the key "exr" of bench/results.json with the load average.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { writeResultsKey } from "@/bench/lib/results";

const here = fileURLToPath(import.meta.url);
const args = process.argv.slice(2);
const quick = args.includes("--quick");

const { exrPlateFloats } = await import("@/scripts/seed/data/exr-plate");
const { encodeExr } = await import("@/lib/exr/encode");
const { decodeExr } = await import("@/lib/exr/decode");

async function frame(width: number, height: number, compression: "zip" | "piz"): Promise<{ bytes: Uint8Array; rgb: Float32Array }> {
  const { before } = exrPlateFloats(width, height, 5);
  const bytes = await encodeExr(before, width, height, { pixelType: "half", compression }, null);
  return { bytes, rgb: before };
}

if (args[0] === "--child-upload") {
  // Child: one 4K OpenEXR through the upload's file work; report the process's peak RSS.
  const dir = args[1]!;
  const { prepareOriginal } = await import("@/lib/stills/inspect");
  const { ensureDerived } = await import("@/lib/stills/display");
  const { defaultColourSpace } = await import("@/lib/stills/colour-default");
  const file = path.join(dir, "plate.exr");
  const bytes = fs.readFileSync(file);
  const t0 = performance.now();
  const prepared = await prepareOriginal(file, path.join(dir, "cleaned.part"), { root: dir });
  const { facts, sha256 } = prepared;
  const target = path.join(dir, "originals", sha256.slice(0, 2), `${sha256}.bin`);
  fs.mkdirSync(path.dirname(target), { recursive: true });
  fs.renameSync(prepared.path, target);
  const exr = facts.exr ? { ...facts.exr } : null;
  await ensureDerived({ sha256, format: facts.format, bitDepth: facts.bitDepth, colourSpace: defaultColourSpace(facts), exr }, dir);
  const ms = performance.now() - t0;
  console.log(JSON.stringify({ peakRssMB: Math.round(process.resourceUsage().maxRSS / 1024), uploadMs: Math.round(ms), fileMB: +(bytes.length / 1e6).toFixed(1) }));
  process.exit(0);
}

async function fastest(reps: number, copy: () => void, fn: () => unknown): Promise<{ ms: number; copyMs: number }> {
  const ts: number[] = [], cs: number[] = [];
  for (let i = 0; i < reps; i++) {
    const c = performance.now();
    copy();
    cs.push(performance.now() - c);
    const t = performance.now();
    await fn();
    ts.push(performance.now() - t);
  }
  return { ms: Math.min(...ts), copyMs: Math.min(...cs) };
}

const loadBefore = os.loadavg().map((v) => +v.toFixed(2));
const sizes: [number, number][] = quick ? [[2048, 1080]] : [[2048, 1080], [4096, 2160]];
const rows: Record<string, unknown>[] = [];
for (const [width, height] of sizes) {
  for (const compression of ["zip", "piz"] as const) {
    const { bytes, rgb } = await frame(width, height, compression);
    const copy = new Float32Array(rgb.length);
    const reps = width > 2048 ? 3 : 5;
    // One decode first, so the reader's code is compiled before anything is timed.
    decodeExr(bytes, { maxPixels: 100_000_000 });
    const r = await fastest(reps, () => copy.set(rgb), () => decodeExr(bytes, { maxPixels: 100_000_000 }));
    const row = { size: `${width}x${height}`, compression, fileMB: +(bytes.length / 1e6).toFixed(1), decodeMs: +r.ms.toFixed(1), copyMs: +r.copyMs.toFixed(2), ratio: +(r.ms / r.copyMs).toFixed(1) };
    rows.push(row);
    console.log(row);
  }
}

let upload: Record<string, unknown> = { skipped: "--quick" };
if (!quick) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-exr-bench-"));
  try {
    fs.writeFileSync(path.join(dir, "plate.exr"), (await frame(4096, 2160, "piz")).bytes);
    const r = spawnSync(process.execPath, [...process.execArgv, here, "--child-upload", dir], { encoding: "utf8", env: process.env });
    if (r.status !== 0) throw new Error(`upload child failed: ${r.stderr}`);
    upload = { ...(JSON.parse(r.stdout.trim().split("\n").pop()!) as Record<string, unknown>), targetMB: 1024 };
    console.log("4K OpenEXR upload (file work):", upload);
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

const loadAfter = os.loadavg().map((v) => +v.toFixed(2));
writeResultsKey("exr", {
  measuredAt: new Date().toISOString(),
  cpus: os.cpus().length,
  loadAverage: { before: loadBefore, after: loadAfter },
  note: "Decode = three's EXRLoader behind Plateroom's checks, per band, into the display window; ratio = decode / float RGB copy of the same frame, fastest of the repetitions. Shared machine: re-measure before relying on a number.",
  decode: rows,
  upload4k: upload,
});
