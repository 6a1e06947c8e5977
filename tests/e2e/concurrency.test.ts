import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { apiClient, createApiToken, randomPng, sha256, type Api } from "@/bench/lib/http-client";
import { DEMO_PASSWORD, startApp, type RunningApp } from "@/tests/e2e/harness";

/**
 * Concurrency (issue 9) against the built server: simultaneous saves of one technique are
 * serialized by a row lock, so exactly one wins and the other gets the stale-revision 409
 * (optimistic concurrency, shared/API.md "PUT /api/techniques/{slug}"); identical uploads
 * share one content-addressed file (OWASP File Upload Cheat Sheet, "rename on store").
 */

type ErrorBody = { error: { code: string; message: string; latest?: { number: number; author: string | null; savedAt: string } } };

let app: RunningApp;
let joel: Api; // senior@kestrel.test, Joel Brackwell (scripts/seed/data/people.ts)
let kofi: Api; // kofi.ashdown@kestrel.test, Kofi Ashdown, also a senior

function walk(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : [path.join(dir, e.name)]));
}

describe("concurrent saves and uploads", () => {
  beforeAll(async () => {
    app = await startApp();
    joel = apiClient(app.baseUrl, await createApiToken(app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD));
    kofi = apiClient(app.baseUrl, await createApiToken(app.baseUrl, "kofi.ashdown@kestrel.test", DEMO_PASSWORD));
  }, 900_000);
  afterAll(async () => app?.stop());

  it("two people saving the same revision at once: one 200, one 409 naming the winner; the loser re-applies", async () => {
    const title = `Concurrent save ${Date.now().toString(36)}`;
    const created = await joel.json<{ slug: string; revision: number }>("POST", "/api/techniques", { title, summary: "Starting text.", aliases: [], tags: [] });
    expect(created.status).toBe(201);
    const { slug, revision: base } = created.body;
    const edit = (summary: string, baseRevision: number, changeNote: string) => ({ title, summary, aliases: [], tags: [], baseRevision, changeNote });

    const [a, b] = await Promise.all([
      joel.json<{ revision: number } | ErrorBody>("PUT", `/api/techniques/${slug}`, edit("Joel's wording.", base, "Joel's edit")),
      kofi.json<{ revision: number } | ErrorBody>("PUT", `/api/techniques/${slug}`, edit("Kofi's wording.", base, "Kofi's edit")),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const [winner, loser] = a.status === 200 ? [{ name: "Joel Brackwell", res: a }, { name: "Kofi Ashdown", res: b, api: kofi, summary: "Kofi's wording." }] : [{ name: "Kofi Ashdown", res: b }, { name: "Joel Brackwell", res: a, api: joel, summary: "Joel's wording." }];
    const won = winner.res.body as { revision: number };
    expect(won.revision).toBe(base + 1);
    const conflict = loser.res.body as ErrorBody;
    expect(conflict.error.code).toBe("conflict");
    expect(conflict.error.message).toContain(winner.name);
    expect(conflict.error.latest).toMatchObject({ number: base + 1, author: winner.name });

    const afterRace = await joel.json<{ items: { number: number; author: { name: string } | null }[] }>("GET", `/api/techniques/${slug}/revisions`);
    expect(afterRace.body.items.map((r) => r.number)).toEqual([base + 1, base]);

    // Nothing lost: the loser saves the same text on top of the winner's revision.
    const retry = await loser.api.json<{ revision: number }>("PUT", `/api/techniques/${slug}`, edit(loser.summary, won.revision, "Re-applied after a conflict"));
    expect(retry.status).toBe(200);
    expect(retry.body.revision).toBe(base + 2);
    const now = await joel.json<{ summary: string; latestRevision: number }>("GET", `/api/techniques/${slug}`);
    expect(now.body).toMatchObject({ summary: loser.summary, latestRevision: base + 2 });
  });

  it("20 parallel uploads of one PNG: 20 × 201 and the original stored once", async () => {
    const png = await randomPng(24, 16);
    const sha = sha256(png);
    const results = await Promise.all(Array.from({ length: 20 }, (_, i) => joel.upload(png, { alt: `Same still, upload ${i + 1}`, owner: "trial" })));
    expect(results.map((r) => r.status)).toEqual(Array(20).fill(201));
    expect(new Set(results.map((r) => r.body.sha256))).toEqual(new Set([sha]));
    expect(new Set(results.map((r) => r.body.id)).size).toBe(20);

    const files = walk(app.uploadsDir);
    expect(files.filter((f) => f.includes(sha)).map((f) => path.relative(app.uploadsDir, f)).sort()).toEqual(
      [`originals/${sha.slice(0, 2)}/${sha}.bin`, `previews/${sha.slice(0, 2)}/${sha}.webp`, `thumbs/${sha.slice(0, 2)}/${sha}.webp`].sort(),
    );
    // No half-written or temp files left behind by the racing requests.
    expect(files.filter((f) => f.endsWith(".tmp") || f.endsWith(".part"))).toEqual([]);
    // Every row serves the exact bytes.
    for (const r of results.slice(0, 5)) {
      const res = await joel.get(`/api/stills/${r.body.id}/original`);
      expect(sha256(Buffer.from(await res.arrayBuffer()))).toBe(sha);
    }
  });
});
