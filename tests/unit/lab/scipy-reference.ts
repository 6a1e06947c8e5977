/*
 * The independent float64 reference for the lab's blurs: Debian's python3-scipy, run as
 * /usr/bin/python3 (never a port of our code). Jobs go in as 16-bit RGB codes plus the recipe's
 * parameters; scipy computes the result in float64 and answers 16-bit codes.
 *
 * Locally the tests that need it skip (with the reason in their name) when /usr/bin/python3 has no
 * scipy; under CI (process.env.CI) they run and fail instead: .ci/run installs python3-scipy.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";

export const PYTHON = "/usr/bin/python3";

/** Why the reference cannot run here, or null when it can. */
export function scipyMissing(): string | null {
  const r = spawnSync(PYTHON, ["-c", "import numpy, scipy.ndimage"], { encoding: "utf8" });
  if (r.status === 0) return null;
  return `${PYTHON} cannot import scipy (${r.error?.message ?? r.stderr.trim().split("\n").pop() ?? "no output"}); install python3-scipy`;
}

/** When to run the reference tests: always in CI (a missing scipy then fails them), locally only with scipy. */
export function scipyGate(): { run: boolean; note: string } {
  const missing = scipyMissing();
  if (!missing) return { run: true, note: "" };
  return process.env.CI ? { run: true, note: "" } : { run: false, note: ` — SKIPPED: ${missing}` };
}

/*
 * The recipe steps the jobs stand for, in scipy's words. Transfer function: IEC 61966-2-1.
 * gaussian_filter with mode="nearest" (edge pixels repeated) and truncate=4.0 (radius
 * int(4σ + 0.5)), in float64 throughout.
 */
const SCRIPT = String.raw`
import json, sys
import numpy as np
from scipy.ndimage import gaussian_filter

def decode(codes, space):
    v = codes.astype(np.float64) / 65535.0
    if space == "linear":
        v = np.where(v <= 0.04045, v / 12.92, ((v + 0.055) / 1.055) ** 2.4)
    return v

def encode(x, space):
    x = np.clip(x, 0.0, 1.0)
    if space == "linear":
        x = np.where(x <= 0.0031308, x * 12.92, 1.055 * np.power(x, 1 / 2.4) - 0.055)
    return np.floor(x * 65535.0 + 0.5).astype("<u2")

def G(p, s):
    return gaussian_filter(p, s, mode="nearest", truncate=4.0)

def ramp(v, black, white):
    return np.clip((v - black) / (white - black), 0.0, 1.0)

for job in json.load(open(sys.argv[1])):
    h, w = job["height"], job["width"]
    img = decode(np.fromfile(job["input"], dtype="<u2").reshape(h, w, 3), job["space"])
    kind = job["kind"]
    if kind == "soften":
        c = "rgb".index(job["channel"])
        img[:, :, c] = G(img[:, :, c], job["sigma"])
    elif kind == "soften-matte":
        # matte from green (0..1), softened; then cur = 1 and mix: m·1 + plate·(1 − m)
        m = G(ramp(img[:, :, 1], 0.0, 1.0), job["sigma"])[:, :, None]
        img = m + img * (1.0 - m)
    elif kind == "flatten":
        wt = job["weights"]
        m = ramp(wt[0] * img[:, :, 0] + wt[1] * img[:, :, 1] + wt[2] * img[:, :, 2], job["black"], job["white"])
        if job["matteSigma"]:
            m = G(m, job["matteSigma"])
        weight = 1.0 - np.clip(m, 0.0, 1.0)          # clean screen: outside the matte
        D = G(weight, job["sigma"])
        tau = job["tau"]
        out = img.copy()
        for c in range(3):
            mean = (img[:, :, c] * weight).sum() / weight.sum()
            N = G(img[:, :, c] * weight, job["sigma"])
            est = np.where(D >= tau, N / np.where(D >= tau, D, 1.0), (N + (tau - D) * mean) / tau)
            out[:, :, c] = np.where(est > 0, img[:, :, c] / np.where(est > 0, est, 1.0) * job["color"][c], img[:, :, c])
        img = out
    else:
        raise ValueError(kind)
    encode(img, job["space"]).tofile(job["output"])
`;

export type ReferenceJob = { width: number; height: number; space: "linear" | "stored"; codes: Uint16Array } & (
  | { kind: "soften"; sigma: number; channel: "r" | "g" | "b" }
  | { kind: "soften-matte"; sigma: number }
  | { kind: "flatten"; sigma: number; matteSigma: number; weights: [number, number, number]; black: number; white: number;
      color: [number, number, number]; tau: number }
);

/** Runs every job in one python process; answers the reference 16-bit codes per job. */
export function scipyReference(jobs: ReferenceJob[]): Uint16Array[] {
  const dir = mkdtempSync(path.join(os.tmpdir(), "lab-scipy-"));
  try {
    const manifest = jobs.map((job, i) => {
      const input = path.join(dir, `in-${i}.raw`), output = path.join(dir, `out-${i}.raw`);
      writeFileSync(input, Buffer.from(job.codes.buffer, job.codes.byteOffset, job.codes.byteLength));
      const { codes: _codes, ...params } = job;
      return { ...params, input, output };
    });
    writeFileSync(path.join(dir, "jobs.json"), JSON.stringify(manifest));
    writeFileSync(path.join(dir, "ref.py"), SCRIPT);
    const r = spawnSync(PYTHON, [path.join(dir, "ref.py"), path.join(dir, "jobs.json")], { encoding: "utf8", timeout: 120_000 });
    if (r.status !== 0) throw new Error(`scipy reference failed: ${r.error?.message ?? r.stderr}`);
    return manifest.map((m) => {
      const b = readFileSync(m.output);
      return new Uint16Array(b.buffer, b.byteOffset, b.byteLength / 2);
    });
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
