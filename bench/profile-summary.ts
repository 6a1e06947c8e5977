/*
 * Sums a V8 CPU profile (bench/.profiles/*.cpuprofile, from PAGE_PROFILE=1) into self time per
 * function and per module, and total (inclusive) time of the functions named on the command line:
 *   [LAST_SECONDS=20] npx tsx bench/profile-summary.ts bench/.profiles/CPU....cpuprofile [top=40] [inclusive names...]
 * No GUI needed; the shares are of the whole profile, idle included (shown on its own line).
 */
import fs from "node:fs";

type Node = { id: number; callFrame: { functionName: string; url: string; lineNumber: number }; children?: number[] };
type Profile = { nodes: Node[]; samples: number[]; timeDeltas: number[] };

// LAST_SECONDS=20: only the profile's last 20 s (the load run), leaving out start-up and warm-up.
const lastSeconds = Number(process.env.LAST_SECONDS ?? 0);
const [file, topArg, ...inclusiveNames] = process.argv.slice(2);
if (!file) throw new Error("usage: profile-summary.ts <file.cpuprofile> [top] [function names for inclusive time...]");
const top = Number(topArg ?? 40);
const profile = JSON.parse(fs.readFileSync(file, "utf8")) as Profile;
const byId = new Map(profile.nodes.map((n) => [n.id, n]));
const parent = new Map<number, number>();
for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);

const selfUs = new Map<number, number>();
const spanUs = profile.timeDeltas.reduce((a, b) => a + b, 0);
let atUs = 0;
profile.samples.forEach((id, i) => {
  atUs += profile.timeDeltas[i] ?? 0;
  if (lastSeconds && atUs < spanUs - lastSeconds * 1e6) return;
  selfUs.set(id, (selfUs.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0));
});
const totalUs = [...selfUs.values()].reduce((a, b) => a + b, 0);

/** Short module name: the package for node_modules, the chunk/file otherwise. */
function moduleOf(url: string): string {
  if (!url) return "(native/vm)";
  const nm = url.lastIndexOf("node_modules/");
  if (nm >= 0) {
    const rest = url.slice(nm + 13).split("/");
    const pkg = rest[0]?.startsWith("@") ? `${rest[0]}/${rest[1]}` : rest[0];
    // Next's compiled vendored packages are worth telling apart.
    if (pkg === "next" && rest.includes("compiled")) return `next/compiled/${rest[rest.indexOf("compiled") + 1]}`;
    if (pkg === "next") return `next/${rest.slice(1, 3).join("/")}`;
    return pkg ?? url;
  }
  return url.replace(/^file:\/\/.*?\/(\.next[^/]*)\//, "$1/");
}

const byFunction = new Map<string, number>();
const byModule = new Map<string, number>();
for (const [id, us] of selfUs) {
  const n = byId.get(id)!;
  const fn = `${n.callFrame.functionName || "(anonymous)"} ${moduleOf(n.callFrame.url)}:${n.callFrame.lineNumber}`;
  byFunction.set(fn, (byFunction.get(fn) ?? 0) + us);
  const mod = n.callFrame.url ? moduleOf(n.callFrame.url) : n.callFrame.functionName;
  byModule.set(mod, (byModule.get(mod) ?? 0) + us);
}

const pct = (us: number) => `${((100 * us) / totalUs).toFixed(1).padStart(5)} %`;
const idle = [...selfUs].filter(([id]) => byId.get(id)?.callFrame.functionName === "(idle)").reduce((a, [, us]) => a + us, 0);
console.log(`profile ${(totalUs / 1e6).toFixed(1)} s, idle ${pct(idle)}, busy ${((totalUs - idle) / 1e6).toFixed(1)} s`);
const show = (title: string, m: Map<string, number>) => {
  console.log(`\n${title}`);
  for (const [k, us] of [...m].sort((a, b) => b[1] - a[1]).slice(0, top)) console.log(`${pct(us)}  ${k}`);
};
show("Self time by module", byModule);
show("Self time by function", byFunction);

// Inclusive time: samples whose stack contains a frame with one of the given names (counted once).
for (const name of inclusiveNames) {
  let us = 0;
  for (const [id, t] of selfUs) {
    for (let cur: number | undefined = id; cur !== undefined; cur = parent.get(cur)) {
      const f = byId.get(cur)!.callFrame;
      if (f.functionName === name || moduleOf(f.url).includes(name)) {
        us += t;
        break;
      }
    }
  }
  console.log(`inclusive ${pct(us)}  ${name}`);
}
