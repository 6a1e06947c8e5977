import fs from "node:fs";
import { linearRegression } from "simple-statistics";

/** Resident memory (bytes) of a process and all its descendants, from /proc (Linux). */
export function treeRss(rootPid: number): number {
  const children = new Map<number, number[]>();
  for (const entry of fs.readdirSync("/proc")) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${entry}/stat`, "utf8");
      // Field 4 (ppid) follows the command name in parentheses, which may hold spaces.
      const ppid = Number(stat.slice(stat.lastIndexOf(")") + 2).split(" ")[1]);
      children.set(ppid, [...(children.get(ppid) ?? []), Number(entry)]);
    } catch {
      // The process ended while we looked.
    }
  }
  let total = 0;
  const stack = [rootPid];
  while (stack.length) {
    const pid = stack.pop()!;
    try {
      const status = fs.readFileSync(`/proc/${pid}/status`, "utf8");
      total += Number(/VmRSS:\s+(\d+) kB/.exec(status)?.[1] ?? 0) * 1024;
    } catch {
      continue;
    }
    stack.push(...(children.get(pid) ?? []));
  }
  return total;
}

/** Least-squares slope of memory over time, MB per minute, for samples of [seconds, bytes]. */
export function slopeMbPerMinute(samples: readonly (readonly [number, number])[]): number {
  if (samples.length < 2) return Number.NaN;
  const { m } = linearRegression(samples.map(([t, bytes]) => [t / 60, bytes / (1024 * 1024)]));
  return Math.round(m * 100) / 100;
}
