import "server-only";

/*
 * One bound on the lab's heavy work in this process — recipe runs and the plot/sample analyses
 * alike: at most `maxConcurrent` at once, at most `maxQueue` waiting (more: LabBusyError → 429),
 * and a wait that passes its deadline ends in LabTimeoutError (→ 503). So one heavy render
 * cannot starve the server, whichever route it came through.
 */

export class LabBusyError extends Error {
  readonly code = "rate_limited" as const;
  constructor() {
    super("the lab is busy; try again shortly");
    this.name = "LabBusyError";
  }
}

export class LabTimeoutError extends Error {
  readonly code = "timeout" as const;
  constructor(ms: number) {
    super(`the lab run took longer than ${Math.round(ms / 1000)} s`);
    this.name = "LabTimeoutError";
  }
}

export type LabLimiter = {
  /** Waits for a slot until `deadline` (ms since the epoch); answers the function that gives it back. */
  acquire(deadline: number, timeoutMs: number): Promise<() => void>;
  stats(): { active: number; queued: number };
};

export function createLabLimiter(opts: { maxConcurrent?: number; maxQueue?: number } = {}): LabLimiter {
  const maxConcurrent = opts.maxConcurrent ?? 2;
  const maxQueue = opts.maxQueue ?? 8;
  let active = 0;
  const waiting: (() => void)[] = [];
  const release = (): void => {
    active--;
    waiting.shift()?.();
  };
  const once = (): (() => void) => {
    let done = false;
    return () => {
      if (!done) {
        done = true;
        release();
      }
    };
  };
  return {
    async acquire(deadline, timeoutMs) {
      if (active < maxConcurrent) {
        active++;
        return once();
      }
      if (waiting.length >= maxQueue) throw new LabBusyError();
      await new Promise<void>((resolve, reject) => {
        const grant = (): void => {
          clearTimeout(timer);
          active++;
          resolve();
        };
        const timer = setTimeout(() => {
          const i = waiting.indexOf(grant);
          if (i >= 0) waiting.splice(i, 1);
          reject(new LabTimeoutError(timeoutMs));
        }, Math.max(0, deadline - Date.now()));
        waiting.push(grant);
      });
      return once();
    },
    stats: () => ({ active, queued: waiting.length }),
  };
}

const globalForLab = globalThis as unknown as { plateroomLabLimiter?: LabLimiter };

/** The process-wide limiter shared by the runner and the analyses (kept on globalThis across HMR). */
export function labLimiter(): LabLimiter {
  return (globalForLab.plateroomLabLimiter ??= createLabLimiter());
}
