import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { chromium, type Browser, type BrowserContext, type Locator, type Page } from "playwright-core";
import { buildWarnings } from "@/scripts/build-log";
import { startFakeSmtp } from "@/scripts/fake-smtp/server";
import { serverNodeOptions } from "@/scripts/server-options";

/**
 * Drives the built app the way people use it: a production build on a free port with its own
 * temporary data folder (a copy of a seeded template), the fake SMTP server beside it, and
 * Debian's Chromium through playwright-core (never a browser download).
 */
const root = process.cwd();
const bin = (name: string) => path.join(root, "node_modules", ".bin", name);
export const CHROMIUM = "/usr/bin/chromium";
export const DEMO_PASSWORD = "plateroom-demo";

/** Browser tests run whenever Chromium is present; in CI its absence is a failure, not a skip. */
export function hasChromium(): boolean {
  if (fs.existsSync(CHROMIUM)) return true;
  if (process.env.CI) throw new Error(`${CHROMIUM} is missing: CI must install Debian's chromium package (see .ci/run).`);
  return false;
}

function newestMtime(paths: string[]): number {
  let newest = 0;
  const walk = (p: string) => {
    if (!fs.existsSync(p)) return;
    const st = fs.statSync(p);
    if (st.isDirectory()) for (const e of fs.readdirSync(p)) walk(path.join(p, e));
    else newest = Math.max(newest, st.mtimeMs);
  };
  paths.forEach((p) => walk(path.join(root, p)));
  return newest;
}

/** Runs a command to its end; its output (stdout, then stderr) is returned, or thrown with the exit status. */
function run(cmd: string, args: string[], env: NodeJS.ProcessEnv): string {
  const r = spawnSync(cmd, args, { cwd: root, env, encoding: "utf8", stdio: ["ignore", "pipe", "pipe"], maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(failure(cmd, args, r.status, r.stdout ?? "", r.stderr ?? ""));
  return `${r.stdout ?? ""}${r.stderr ?? ""}`;
}

/** `run`, without blocking this process (so two commands can run side by side). */
function runAsync(cmd: string, args: string[], env: NodeJS.ProcessEnv): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { cwd: root, env, stdio: ["ignore", "pipe", "pipe"] });
    let stdout = "";
    let stderr = "";
    child.stdout.on("data", (d: Buffer) => (stdout += d.toString()));
    child.stderr.on("data", (d: Buffer) => (stderr += d.toString()));
    child.once("error", reject);
    child.once("close", (status) => (status === 0 ? resolve(`${stdout}${stderr}`) : reject(new Error(failure(cmd, args, status, stdout, stderr)))));
  });
}

function failure(cmd: string, args: string[], status: number | null, stdout: string, stderr: string): string {
  return `${path.basename(cmd)} ${args.join(" ")} failed (${status}):\n${stdout.slice(-4000)}\n${stderr.slice(-4000)}`;
}

const SOURCES = ["app", "components", "lib", "db", "public", "proxy.ts", "instrumentation.ts", "next.config.ts", "package-lock.json", "postcss.config.mjs"];

function baseEnv(extra: Record<string, string> = {}): NodeJS.ProcessEnv {
  const { NODE_OPTIONS: _n, VITEST: _v, VITEST_POOL_ID: _p, VITEST_WORKER_ID: _w, NODE_ENV: _e, ...rest } = process.env;
  return { ...rest, NEXT_TELEMETRY_DISABLED: "1", ...extra } as unknown as NodeJS.ProcessEnv;
}

/**
 * The tests' build has its own folder, so `npm test` can build it while `npm run typecheck`
 * generates the route types in `.next` beside it (PLATEROOM_DIST_DIR picks another folder).
 */
const distDir = process.env.PLATEROOM_DIST_DIR || ".next-e2e";

/** Tries to take a cross-process lock (mkdir is atomic); clears a lock left by a run that died. */
function tryLock(lock: string, started: number): boolean {
  try {
    fs.mkdirSync(lock);
    return true;
  } catch {
    // A lock older than 20 minutes belongs to a run that died.
    if (Date.now() - (fs.statSync(lock, { throwIfNoEntry: false })?.mtimeMs ?? Date.now()) > 20 * 60_000) fs.rmSync(lock, { recursive: true, force: true });
    if (Date.now() - started > 30 * 60_000) throw new Error(`Timed out waiting for ${lock}`);
    return false;
  }
}

const lockPath = (name: string) => path.join(os.tmpdir(), `plateroom-${name}.lock`);

/** A cross-process lock, so parallel runs never build or seed into the same folder at once. */
function withLock<T>(name: string, work: () => T): T {
  const lock = lockPath(name);
  const started = Date.now();
  while (!tryLock(lock, started)) Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 1000);
  try {
    return work();
  } finally {
    fs.rmSync(lock, { recursive: true, force: true });
  }
}

async function withLockAsync<T>(name: string, work: () => Promise<T>): Promise<T> {
  const lock = lockPath(name);
  const started = Date.now();
  while (!tryLock(lock, started)) await new Promise((r) => setTimeout(r, 1000));
  try {
    return await work();
  } finally {
    fs.rmSync(lock, { recursive: true, force: true });
  }
}

/** A step that makes something the browser tests need, under its lock, unless it is already there. */
type Step = { lock: string; done(): boolean; command: [string, string[], NodeJS.ProcessEnv]; before(): void; after(output: string): void; cleanup(): void };

function runStep(step: Step): void {
  withLock(step.lock, () => {
    if (step.done()) return;
    step.before();
    try {
      step.after(run(...step.command));
    } finally {
      step.cleanup();
    }
  });
}

async function runStepAsync(step: Step): Promise<void> {
  await withLockAsync(step.lock, async () => {
    if (step.done()) return;
    step.before();
    try {
      step.after(await runAsync(...step.command));
    } finally {
      step.cleanup();
    }
  });
}

const buildLog = path.join(root, distDir, "build.log");

/**
 * Builds the app when there is no build or a source is newer than it. The build's output is kept
 * beside it, and a build that printed a warning fails every browser test (scripts/build-log.ts).
 */
function buildStep(): Step {
  const buildId = path.join(root, distDir, "BUILD_ID");
  const tsconfigPath = path.join(root, "tsconfig.json");
  let tsconfig = "";
  return {
    lock: `build-${distDir.replace(/[^a-z0-9]/gi, "_")}`,
    done: () => fs.existsSync(buildId) && fs.existsSync(buildLog) && fs.statSync(buildId).mtimeMs >= newestMtime(SOURCES),
    // PLATEROOM_TEST_BUILD: no second type check (npm run typecheck covers it), see next.config.ts.
    command: [bin("next"), ["build"], baseEnv({ NODE_ENV: "production", PLATEROOM_DIST_DIR: distDir, PLATEROOM_TEST_BUILD: "1" })],
    before() {
      // Under CI, next build warns "No build cache found" when <dist>/cache is missing (a fresh clone):
      // the folder is where it keeps its cache, so make it rather than let the notice fail the check.
      fs.mkdirSync(path.join(root, distDir, "cache"), { recursive: true });
      tsconfig = fs.readFileSync(tsconfigPath, "utf8");
    },
    after: (output) => fs.writeFileSync(buildLog, output),
    // next build adds its folder's type globs to tsconfig.json: not to be committed (and the
    // exclude of .next-* leaves them out anyway), so the file is put back as it was.
    cleanup() {
      if (fs.readFileSync(tsconfigPath, "utf8") !== tsconfig) fs.writeFileSync(tsconfigPath, tsconfig);
    },
  };
}

function checkBuildLog(): void {
  const warnings = buildWarnings(fs.readFileSync(buildLog, "utf8"));
  if (warnings.length) throw new Error(`next build printed ${warnings.length} warning line(s) (full output in ${path.relative(root, buildLog)}):\n${warnings.join("\n")}`);
}

export function ensureBuild(): void {
  runStep(buildStep());
  checkBuildLog();
}

/** A migrated and seeded data folder, made once and reused while migrations and seed data stay the same. */
function seedStep(): Step & { data: string; uploads: string } {
  const stamp = crypto
    .createHash("sha256")
    .update(String(newestMtime(["db", "scripts/seed", "scripts/seed.ts", "lib/lab/synthetic.ts"])))
    .digest("hex")
    .slice(0, 12);
  const dir = path.join(root, "tests", ".tmp", `e2e-template-${stamp}`);
  const data = path.join(dir, "data");
  const uploads = path.join(dir, "uploads");
  return {
    data,
    uploads,
    lock: "seed-template",
    done: () => fs.existsSync(path.join(dir, "ready")),
    command: [bin("tsx"), ["-C", "react-server", "scripts/seed.ts"], baseEnv({ PLATEROOM_DATA_DIR: data, PLATEROOM_UPLOADS_DIR: uploads })],
    before: () => fs.rmSync(dir, { recursive: true, force: true }),
    after: () => fs.writeFileSync(path.join(dir, "ready"), new Date().toISOString()),
    cleanup: () => undefined,
  };
}

export function seededTemplate(): { data: string; uploads: string } {
  const step = seedStep();
  runStep(step);
  return { data: step.data, uploads: step.uploads };
}

/** The build and the seeded template side by side (they do not depend on each other): the browser tests' global setup. */
export async function prepareBuildAndData(): Promise<void> {
  await Promise.all([runStepAsync(buildStep()), runStepAsync(seedStep())]);
  checkBuildLog();
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

async function waitFor(url: string, child: ChildProcess, log: () => string, timeoutMs = 90_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`The app exited (${child.exitCode}):\n${log()}`);
    try {
      const res = await fetch(url);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`The app did not become healthy at ${url}:\n${log()}`);
}

export type RunningApp = { baseUrl: string; dataDir: string; uploadsDir: string; inboxDir: string; smtpPort: number; pid: number; stop(): Promise<void> };

/** Starts a fresh copy of the seeded app; each test file gets its own. `env` adds or overrides variables. */
export async function startApp(options: { env?: Record<string, string>; nodeArgs?: string[] } = {}): Promise<RunningApp> {
  ensureBuild();
  const { work, dataDir, uploadsDir } = copySeededData();
  const inboxDir = path.join(dataDir, "mail-inbox");
  const [port, smtpPort] = [await freePort(), await freePort()];
  const env = baseEnv({
    NODE_ENV: "production",
    PLATEROOM_DIST_DIR: distDir,
    PORT: String(port),
    PLATEROOM_DATA_DIR: dataDir,
    PLATEROOM_UPLOADS_DIR: uploadsDir,
    AUTH_SECRET: crypto.randomBytes(32).toString("base64url"),
    SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
    PLATEROOM_BASE_URL: `http://127.0.0.1:${port}`,
    NODE_OPTIONS: serverNodeOptions(),
    ...options.env,
  });
  let output = "";
  // The fake SMTP server (scripts/fake-smtp/server.ts) runs in this process: a process of its own
  // per app cost a TypeScript compile at every start.
  const smtp = await startFakeSmtp({ port: smtpPort, host: "127.0.0.1", storeDir: inboxDir, quiet: true });
  // nodeArgs (benchmarks: --cpu-prof, which NODE_OPTIONS refuses) go to the node running `next start`,
  // beside the server's own V8 options in NODE_OPTIONS (scripts/server-options.ts).
  const app = options.nodeArgs?.length
    ? spawn(process.execPath, [...options.nodeArgs, bin("next"), "start", "-p", String(port), "-H", "127.0.0.1"], { cwd: root, env })
    : spawn(bin("next"), ["start", "-p", String(port), "-H", "127.0.0.1"], { cwd: root, env });
  app.stdout?.on("data", (d: Buffer) => (output += d.toString()));
  app.stderr?.on("data", (d: Buffer) => (output += d.toString()));
  const baseUrl = `http://127.0.0.1:${port}`;
  try {
    await waitFor(`${baseUrl}/api/health`, app, () => output.slice(-6000));
  } catch (error) {
    if (app.exitCode === null) app.kill("SIGKILL");
    await smtp.stop();
    throw error;
  }
  return {
    baseUrl,
    dataDir,
    uploadsDir,
    inboxDir,
    smtpPort,
    pid: app.pid ?? 0,
    async stop() {
      if (app.exitCode === null && app.signalCode === null) {
        const exited = new Promise((r) => app.once("exit", r));
        app.kill("SIGTERM");
        await Promise.race([exited, new Promise((r) => setTimeout(r, 5_000))]);
      }
      // Open client connections could hold close() for ever.
      await Promise.race([smtp.stop(), new Promise((r) => setTimeout(r, 2_000))]);
      fs.rmSync(work, { recursive: true, force: true });
    },
  };
}

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run", "--disable-quic"],
  });
}

type Cookies = Awaited<ReturnType<BrowserContext["cookies"]>>;
/** The session cookies of each person already signed in on an app, and the page sign-in led to. */
const signedIn = new Map<string, { cookies: Cookies; landing: string }>();

/**
 * Signs in through the sign-in page, as a person would. The first time per app and person only:
 * later calls open a fresh context holding that session's cookies (nothing else of the earlier
 * context) on the page the sign-in led to, and sign in again if the session has ended.
 */
export async function signIn(browser: Browser, baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ baseURL: baseUrl, viewport: { width: 1400, height: 900 } });
  const page = await context.newPage();
  const key = `${baseUrl} ${email} ${password}`;
  const saved = signedIn.get(key);
  if (saved) {
    await context.addCookies(saved.cookies);
    await page.goto(saved.landing);
    if (!new URL(page.url()).pathname.startsWith("/login")) return { context, page };
    signedIn.delete(key);
    await context.clearCookies();
  }
  await page.goto("/login");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/login"), { timeout: 30_000 });
  const landing = new URL(page.url());
  signedIn.set(key, { cookies: await context.cookies(), landing: `${landing.pathname}${landing.search}` });
  return { context, page };
}

export const SCREENSHOT_DIR = path.join(root, "tests", ".tmp", "screenshots");
export async function screenshot(page: Page, name: string): Promise<void> {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), fullPage: true });
}

/** Until React has hydrated the page (app/providers.tsx marks <html>): client forms answer clicks only then. */
export async function whenHydrated(page: Page, timeout = 30_000): Promise<void> {
  await page.locator("html[data-hydrated]").waitFor({ state: "attached", timeout });
}

/** Waits for the element to be visible; false (not a throw) when it never shows. */
export async function isShown(locator: Locator, timeout = 10_000): Promise<boolean> {
  try {
    await locator.first().waitFor({ state: "visible", timeout });
    return true;
  } catch {
    return false;
  }
}

/** A fresh copy of the seeded data and uploads folders in a new temporary folder (removed by the caller). */
export function copySeededData(): { work: string; dataDir: string; uploadsDir: string } {
  const template = seededTemplate();
  const work = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-e2e-"));
  const dataDir = path.join(work, "data");
  const uploadsDir = path.join(work, "uploads");
  fs.cpSync(template.data, dataDir, { recursive: true });
  fs.cpSync(template.uploads, uploadsDir, { recursive: true });
  return { work, dataDir, uploadsDir };
}

export type ServerProcess = { baseUrl: string; child: ChildProcess; output(): string; exited(): Promise<void> };

/**
 * Starts the built app on the given data and uploads folders (no mail sender), so a test can
 * kill it (even with SIGKILL) and start it again on the same folders. The caller ends it.
 */
export async function startServerOn(dataDir: string, uploadsDir: string, options: { authSecret?: string; env?: Record<string, string> } = {}): Promise<ServerProcess> {
  ensureBuild();
  const port = await freePort();
  const env = baseEnv({
    NODE_ENV: "production",
    PLATEROOM_DIST_DIR: distDir,
    PORT: String(port),
    PLATEROOM_DATA_DIR: dataDir,
    PLATEROOM_UPLOADS_DIR: uploadsDir,
    AUTH_SECRET: options.authSecret ?? crypto.randomBytes(32).toString("base64url"),
    PLATEROOM_MAIL_SENDER: "off",
    PLATEROOM_BASE_URL: `http://127.0.0.1:${port}`,
    NODE_OPTIONS: serverNodeOptions(),
    ...options.env,
  });
  let output = "";
  const child = spawn(bin("next"), ["start", "-p", String(port), "-H", "127.0.0.1"], { cwd: root, env });
  child.stdout?.on("data", (d: Buffer) => (output += d.toString()));
  child.stderr?.on("data", (d: Buffer) => (output += d.toString()));
  const exit = new Promise<void>((resolve) => child.once("exit", () => resolve()));
  const baseUrl = `http://127.0.0.1:${port}`;
  try {
    await waitFor(`${baseUrl}/api/health`, child, () => output.slice(-6000));
  } catch (error) {
    if (child.exitCode === null) child.kill("SIGKILL");
    throw error;
  }
  return { baseUrl, child, output: () => output, exited: () => (child.exitCode !== null || child.signalCode !== null ? Promise.resolve() : exit) };
}
