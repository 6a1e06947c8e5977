import fs from "node:fs";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { apiClient, createApiToken, randomPng, sha256, type Api } from "@/bench/lib/http-client";
import { copySeededData, DEMO_PASSWORD, startServerOn, type ServerProcess } from "@/tests/e2e/harness";

/**
 * Crash safety (issue 9): a burst of writes over HTTP, the server killed with SIGKILL in the
 * middle, then started again on the same folders. A write the server answered 2xx is
 * acknowledged and must survive: the promise PostgreSQL makes for a committed transaction
 * (PostgreSQL 17 docs, "Reliability and the Write-Ahead Log": a commit is durable once its
 * WAL record is written; crash recovery replays it). A process kill leaves the kernel's page
 * cache intact, so even with fsync off (PGlite's default `-F`) nothing written may be lost.
 */

const BURST = 500;
const KILL_AFTER = 250;
const LANES = 6;
const SEEDED_TECHNIQUE = "marker-channel-cleanup";
// Seeded shots of the show Saltmarsh (scripts/seed/data/shows.ts).
const SHOTS = ["SLM_010_0010", "SLM_040_0120", "SLM_040_0130", "SLM_070_0030"];

type Ack =
  | { kind: "technique"; slug: string; title: string }
  | { kind: "revision"; slug: string; revision: number; changeNote: string }
  | { kind: "use"; id: string; note: string }
  | { kind: "still"; id: string; sha: string; bytes: Buffer };

const run = `crash-${Date.now().toString(36)}`;
let folders: { work: string; dataDir: string; uploadsDir: string };
let server: ServerProcess | null = null;
const authSecret = "reliability-crash-test-secret-0123456789abcdef";
let token = "";
const acks: Ack[] = [];
let attempted = 0;
let inFlightAtKill = 0;

async function burst(api: Api): Promise<void> {
  let inFlight = 0;
  let killed = false;
  const kill = () => {
    if (killed || !server) return;
    killed = true;
    inFlightAtKill = inFlight;
    server.child.kill("SIGKILL");
  };
  // Each lane owns its techniques, so its revisions never race another lane's (no 409s here).
  const lane = async (laneNo: number) => {
    let mine: { slug: string; title: string; revision: number } | null = null;
    for (let step = 0; attempted < BURST && !killed; step++) {
      attempted++;
      const n = attempted;
      inFlight++;
      try {
        const kind = mine === null || step % 4 === 0 ? "technique" : (["revision", "use", "still"] as const)[step % 4 - 1]!;
        if (kind === "technique") {
          const title = `Burst ${run} lane ${laneNo} write ${n}`;
          const r = await api.json<{ slug: string; revision: number }>("POST", "/api/techniques", {
            title,
            summary: `Written by the crash-safety burst, write ${n}.`,
            aliases: [],
            tags: [],
          });
          if (r.status !== 201) throw new Error(`POST /api/techniques ${r.status} ${JSON.stringify(r.body)}`);
          mine = { slug: r.body.slug, title, revision: r.body.revision };
          acks.push({ kind, slug: r.body.slug, title });
        } else if (kind === "revision" && mine) {
          const changeNote = `burst revision ${n}`;
          const r = await api.json<{ slug: string; revision: number }>("PUT", `/api/techniques/${mine.slug}`, {
            title: mine.title,
            summary: `Revised by the crash-safety burst, write ${n}.`,
            aliases: [],
            tags: [],
            baseRevision: mine.revision,
            changeNote,
          });
          if (r.status !== 200) throw new Error(`PUT ${mine.slug} ${r.status} ${JSON.stringify(r.body)}`);
          mine.revision = r.body.revision;
          acks.push({ kind, slug: r.body.slug, revision: r.body.revision, changeNote });
        } else if (kind === "use") {
          const note = `burst use ${run} ${n}`;
          const r = await api.json<{ id: string }>("POST", `/api/techniques/${SEEDED_TECHNIQUE}/uses`, { shot: SHOTS[n % SHOTS.length], outcome: "clean", note });
          if (r.status !== 201) throw new Error(`POST uses ${r.status} ${JSON.stringify(r.body)}`);
          acks.push({ kind, id: r.body.id, note });
        } else {
          const bytes = await randomPng();
          const r = await api.upload(bytes, { alt: `Burst still ${n}`, owner: "trial" });
          if (r.status !== 201 || !r.body.id) throw new Error(`POST /api/stills ${r.status} ${JSON.stringify(r.body)}`);
          acks.push({ kind: "still", id: r.body.id, sha: sha256(bytes), bytes });
        }
      } catch (error) {
        // After the kill, a refused or cut connection is the expected end of the lane; before it, a failure is a bug.
        if (!killed) throw error;
        return;
      } finally {
        inFlight--;
      }
      if (acks.length >= KILL_AFTER) kill();
    }
  };
  await Promise.all(Array.from({ length: LANES }, (_, i) => lane(i + 1)));
}

describe("crash safety: SIGKILL in the middle of a write burst", () => {
  beforeAll(async () => {
    folders = copySeededData();
    server = await startServerOn(folders.dataDir, folders.uploadsDir, { authSecret });
    token = await createApiToken(server.baseUrl, "senior@kestrel.test", DEMO_PASSWORD, "crash burst");
  }, 900_000);

  afterAll(async () => {
    if (server && server.child.exitCode === null && server.child.signalCode === null) {
      server.child.kill("SIGTERM");
      await server.exited();
    }
    if (folders) fs.rmSync(folders.work, { recursive: true, force: true });
  });

  it("keeps every acknowledged write after kill -9 and a restart", async () => {
    await burst(apiClient(server!.baseUrl, token));
    await server!.exited();
    // The burst really was cut: the kill came with writes still in flight and the plan unfinished.
    expect(server!.child.signalCode).toBe("SIGKILL");
    expect(acks.length).toBeGreaterThanOrEqual(KILL_AFTER);
    expect(acks.length).toBeLessThan(BURST);
    expect(inFlightAtKill).toBeGreaterThan(0);
    const counts = Object.fromEntries(["technique", "revision", "use", "still"].map((k) => [k, acks.filter((a) => a.kind === k).length]));
    console.log(`[crash-safety] ${acks.length} acknowledged of ${attempted} sent, ${inFlightAtKill} in flight at SIGKILL`, counts);

    // Restart on the same folders: the database opens (crash recovery) and answers.
    server = await startServerOn(folders.dataDir, folders.uploadsDir, { authSecret });
    const health = await fetch(`${server.baseUrl}/api/health`);
    expect(health.status).toBe(200);
    expect(await health.json()).toMatchObject({ status: "ok", db: "ok" });
    const api = apiClient(server.baseUrl, token);

    const missing: string[] = [];
    for (const a of acks.filter((x) => x.kind === "technique")) {
      const r = await api.json<{ title: string }>("GET", `/api/techniques/${a.slug}`);
      if (r.status !== 200 || r.body.title !== a.title) missing.push(`technique ${a.slug} (${r.status})`);
    }
    const bySlug = new Map<string, Set<string>>();
    for (const a of acks) {
      if (a.kind !== "revision") continue;
      if (!bySlug.has(a.slug)) {
        const r = await api.json<{ items: { number: number; changeNote: string }[] }>("GET", `/api/techniques/${a.slug}/revisions`);
        bySlug.set(a.slug, new Set((r.body?.items ?? []).map((i) => `${i.number}:${i.changeNote}`)));
      }
      if (!bySlug.get(a.slug)!.has(`${a.revision}:${a.changeNote}`)) missing.push(`revision ${a.slug}#${a.revision}`);
    }
    const useNotes = new Set<string>();
    for (let offset = 0; ; offset += 200) {
      const r = await api.json<{ items: { id: string; note: string }[]; total: number }>("GET", `/api/techniques/${SEEDED_TECHNIQUE}/uses?limit=200&offset=${offset}`);
      expect(r.status).toBe(200);
      r.body.items.forEach((u) => useNotes.add(`${u.id}:${u.note}`));
      if (offset + 200 >= r.body.total) break;
    }
    for (const a of acks) if (a.kind === "use" && !useNotes.has(`${a.id}:${a.note}`)) missing.push(`use ${a.id}`);
    for (const a of acks) {
      if (a.kind !== "still") continue;
      const original = await api.get(`/api/stills/${a.id}/original`);
      const bytes = Buffer.from(await original.arrayBuffer());
      if (original.status !== 200 || sha256(bytes) !== a.sha) missing.push(`still ${a.id} original (${original.status})`);
      for (const variant of ["preview", "thumb"]) {
        const res = await api.get(`/api/stills/${a.id}/${variant}`);
        await res.arrayBuffer();
        if (res.status !== 200) missing.push(`still ${a.id} ${variant} (${res.status})`);
      }
    }
    const kinds = new Set(acks.map((a) => a.kind));
    expect([...kinds].sort()).toEqual(["revision", "still", "technique", "use"]);
    expect(missing).toEqual([]);

    // Stop cleanly, then read the stills table itself: every row (also ones whose answer the kill
    // cut off) must point at an original, a preview and a thumbnail on disk (lib/stills/storage.ts layout).
    server.child.kill("SIGTERM");
    await server.exited();
    const db = new PGlite(path.join(folders.dataDir, "pg"));
    const { rows } = await db.query<{ sha256: string }>("select distinct sha256 from stills");
    await db.close();
    expect(rows.length).toBeGreaterThanOrEqual(acks.filter((a) => a.kind === "still").length);
    const absent: string[] = [];
    for (const { sha256: sha } of rows) {
      const shard = sha.slice(0, 2);
      for (const p of [`originals/${shard}/${sha}.bin`, `previews/${shard}/${sha}.webp`, `thumbs/${shard}/${sha}.webp`]) {
        if (!fs.existsSync(path.join(folders.uploadsDir, p))) absent.push(p);
      }
    }
    expect(absent).toEqual([]);
  }, 900_000);
});
