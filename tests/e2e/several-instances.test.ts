import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startServerOn, type ServerProcess } from "@/tests/e2e/harness";

/*
 * README "Beyond one machine": two app instances on one PostgreSQL server (the CI's, in
 * PLATEROOM_TEST_PG_URL). A technique written through one instance is found by the other's
 * search within a second: the database's notice (LISTEN/NOTIFY, migration 0003) reaches the
 * other instance's index, not its 30-second poll. In CI the server is always there.
 */

const serverUrl = process.env.PLATEROOM_TEST_PG_URL;
if (!serverUrl && process.env.CI) throw new Error("PLATEROOM_TEST_PG_URL is not set: .ci/run starts PostgreSQL for this test.");

const withDatabase = (url: string, db: string) => Object.assign(new URL(url), { pathname: `/${db}` }).toString();

describe.skipIf(!serverUrl)("two instances on one PostgreSQL server", () => {
  const dbName = `plateroom_e2e_${crypto.randomBytes(5).toString("hex")}`;
  const work = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-two-"));
  const uploads = path.join(work, "uploads");
  const token = `plr_${crypto.randomBytes(24).toString("base64url")}`;
  let a: ServerProcess;
  let b: ServerProcess;

  beforeAll(async () => {
    const admin = new pg.Client({ connectionString: serverUrl });
    await admin.connect();
    await admin.query(`CREATE DATABASE ${dbName}`);
    await admin.end();
    const env = { DATABASE_URL: withDatabase(serverUrl!, dbName) };
    // One instance migrates first; the second starts on the migrated schema, as a rolling start would.
    a = await startServerOn(path.join(work, "a"), uploads, { env });
    const db = new pg.Client({ connectionString: env.DATABASE_URL });
    await db.connect();
    const { rows } = await db.query<{ id: string }>(`insert into users (email, name, role) values ('lead.two@kestrel.test', 'Two Instances', 'lead') returning id`);
    await db.query(`insert into api_tokens (user_id, name, token_hash) values ($1, 'e2e', $2)`, [rows[0]!.id, crypto.createHash("sha256").update(token).digest("hex")]);
    await db.end();
    b = await startServerOn(path.join(work, "b"), uploads, { env });
  }, 240_000);

  afterAll(async () => {
    for (const s of [a, b]) if (s?.child.exitCode === null) s.child.kill("SIGTERM");
    await Promise.all([a?.exited(), b?.exited()]);
    const admin = new pg.Client({ connectionString: serverUrl });
    await admin.connect();
    await admin.query(`DROP DATABASE IF EXISTS ${dbName} WITH (FORCE)`);
    await admin.end();
    fs.rmSync(work, { recursive: true, force: true });
  });

  const call = (s: ServerProcess, method: string, url: string, body?: unknown) =>
    fetch(`${s.baseUrl}${url}`, { method, headers: { authorization: `Bearer ${token}`, ...(body ? { "content-type": "application/json" } : {}) }, body: body ? JSON.stringify(body) : undefined });

  it("a technique written on one instance is found by the other's search within a second", async () => {
    const created = await call(a, "POST", "/api/techniques", { title: "Quillwort marker paint-out", summary: "Invented method for a found-by-search check.", aliases: [], tags: [], recipe: [] });
    expect(created.status).toBe(201);
    const { slug } = (await created.json()) as { slug: string };
    const started = Date.now();
    let foundAfter: number | null = null;
    while (Date.now() - started < 1000) {
      const res = await call(b, "GET", "/api/search?q=quillwort");
      const body = (await res.json()) as { results: { slug: string }[] };
      if (body.results.some((r) => r.slug === slug)) {
        foundAfter = Date.now() - started;
        break;
      }
      await new Promise((r) => setTimeout(r, 25));
    }
    expect(foundAfter, "found on the other instance (ms)").not.toBeNull();
  });
});
