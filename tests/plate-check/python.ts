import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";

/*
 * Debian's python3 with python3-scipy as an independent reference (shared/REFERENCES.md). Locally a
 * missing scipy skips the checks that need it, with a message; in CI (CI set) it is a failure.
 */

export const PYTHON = "/usr/bin/python3";

let cached: boolean | null = null;

export function hasScipy(): boolean {
  if (cached !== null) return cached;
  const ok = fs.existsSync(PYTHON) && spawnSync(PYTHON, ["-c", "import scipy.signal, numpy"], { encoding: "utf8" }).status === 0;
  if (!ok && process.env.CI) throw new Error(`${PYTHON} with scipy is missing: CI must install Debian's python3-scipy (see .ci/run).`);
  if (!ok) console.warn(`[plate-check tests] ${PYTHON} with scipy not found: the scipy reference checks are skipped locally.`);
  cached = ok;
  return ok;
}

/**
 * Runs a python script with float32 planes written to `<dir>/<name>.f32` and `meta` as
 * `<dir>/meta.json`; the script gets the folder as argv[1] and prints JSON.
 */
export function runPython(script: string, planes: Record<string, Float32Array>, meta: unknown = {}): unknown {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-py-"));
  try {
    fs.writeFileSync(path.join(dir, "meta.json"), JSON.stringify(meta));
    for (const [name, data] of Object.entries(planes)) fs.writeFileSync(path.join(dir, `${name}.f32`), Buffer.from(data.buffer, data.byteOffset, data.byteLength));
    const r = spawnSync(PYTHON, ["-c", script, dir], { encoding: "utf8", maxBuffer: 16 * 1024 * 1024 });
    if (r.status !== 0) throw new Error(`python failed: ${r.stderr}`);
    return JSON.parse(r.stdout);
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}
