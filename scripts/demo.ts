/**
 * `npm run demo`: builds if needed, migrates, seeds, starts the fake SMTP server and serves the
 * production build on PORT. Installs nothing. Honours PLATEROOM_DATA_DIR and PLATEROOM_UPLOADS_DIR
 * (and PORT), so two demos can run side by side.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { serverNodeOptions } from "./server-options";

const root = process.cwd();
const dataDir = path.resolve(process.env.PLATEROOM_DATA_DIR ?? ".data");
const uploadsDir = path.resolve(process.env.PLATEROOM_UPLOADS_DIR ?? "uploads");
const port = Number(process.env.PORT ?? 3000);
const bin = (name: string) => path.join(root, "node_modules", ".bin", name);

function secret(): string {
  if (process.env.AUTH_SECRET) return process.env.AUTH_SECRET;
  const file = path.join(dataDir, "auth-secret");
  if (fs.existsSync(file)) return fs.readFileSync(file, "utf8").trim();
  fs.mkdirSync(dataDir, { recursive: true });
  const value = crypto.randomBytes(32).toString("base64url");
  fs.writeFileSync(file, value, { mode: 0o600 });
  return value;
}

/** Newest modification time under the sources a build depends on. */
function newestSource(): number {
  let newest = 0;
  const walk = (p: string) => {
    if (!fs.existsSync(p)) return;
    const st = fs.statSync(p);
    if (st.isDirectory()) {
      for (const entry of fs.readdirSync(p)) if (entry !== "node_modules" && !entry.startsWith(".")) walk(path.join(p, entry));
    } else newest = Math.max(newest, st.mtimeMs);
  };
  for (const p of ["app", "components", "lib", "db", "public", "proxy.ts", "instrumentation.ts", "next.config.ts", "package-lock.json", "postcss.config.mjs"]) walk(path.join(root, p));
  return newest;
}

function needsBuild(): boolean {
  const buildId = path.join(root, ".next", "BUILD_ID");
  return !fs.existsSync(buildId) || fs.statSync(buildId).mtimeMs < newestSource();
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv): void {
  const result = spawnSync(cmd, args, { stdio: "inherit", env });
  if (result.status !== 0) {
    console.error(`\n${path.basename(cmd)} ${args.join(" ")} failed (exit ${result.status}).`);
    process.exit(result.status ?? 1);
  }
}

function freePort(preferred: number): Promise<number> {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once("error", () => {
      const fallback = net.createServer();
      fallback.listen(0, "127.0.0.1", () => {
        const p = (fallback.address() as net.AddressInfo).port;
        fallback.close(() => resolve(p));
      });
    });
    server.listen(preferred, "127.0.0.1", () => server.close(() => resolve(preferred)));
  });
}

const { NODE_OPTIONS: _ignored, ...inherited } = process.env;
const baseEnv: NodeJS.ProcessEnv = {
  ...inherited,
  PLATEROOM_DATA_DIR: dataDir,
  PLATEROOM_UPLOADS_DIR: uploadsDir,
  AUTH_SECRET: secret(),
  PORT: String(port),
  PLATEROOM_BASE_URL: process.env.PLATEROOM_BASE_URL ?? `http://localhost:${port}`,
  NEXT_TELEMETRY_DISABLED: "1",
};

if (needsBuild()) {
  console.log("Building Plateroom (first run, or sources changed)…");
  run(bin("next"), ["build"], { ...baseEnv, NODE_ENV: "production" });
}

console.log("Preparing the database and demo data…");
fs.mkdirSync(uploadsDir, { recursive: true });
run(bin("tsx"), ["-C", "react-server", "scripts/migrate.ts"], baseEnv);
run(bin("tsx"), ["-C", "react-server", "scripts/seed.ts"], baseEnv);

const smtpPort = await freePort(2525);
const env: NodeJS.ProcessEnv = { ...baseEnv, SMTP_URL: `smtp://127.0.0.1:${smtpPort}`, NODE_ENV: "production" };
const children: ChildProcess[] = [];
children.push(spawn(bin("tsx"), ["-C", "react-server", "scripts/fake-smtp.ts", "--port", String(smtpPort)], { stdio: "inherit", env }));
const app = spawn(bin("next"), ["start", "-p", String(port)], { stdio: ["inherit", "pipe", "inherit"], env: { ...env, NODE_OPTIONS: serverNodeOptions() } });
children.push(app);

let announced = false;
app.stdout?.on("data", (chunk: Buffer) => {
  process.stdout.write(chunk);
  if (!announced && /Ready|started server|Local:/i.test(chunk.toString())) {
    announced = true;
    console.log(`
  Plateroom is running at http://localhost:${port}
  Data: ${dataDir}   Uploads: ${uploadsDir}   Mail: smtp://127.0.0.1:${smtpPort} (fake; read it under Mail as admin)

  Demo accounts (password: plateroom-demo)
    artist@kestrel.test   artist
    senior@kestrel.test   senior
    lead@kestrel.test     lead
    admin@kestrel.test    admin
`);
  }
});

function stopAll(code: number) {
  for (const child of children) if (child.exitCode === null) child.kill("SIGTERM");
  setTimeout(() => process.exit(code), 1500).unref();
}
app.on("exit", (code) => stopAll(code ?? 0));
for (const signal of ["SIGINT", "SIGTERM"] as const) process.on(signal, () => stopAll(0));
