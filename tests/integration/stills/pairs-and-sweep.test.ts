import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { and, count, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as upload } from "@/app/api/stills/route";
import { GET as listPairs, POST as postPair } from "@/app/api/stills/pairs/route";
import { DELETE as deletePairRoute } from "@/app/api/stills/pairs/[id]/route";
import { getDb } from "@/db/client";
import { revisions, stillPairs, stills } from "@/db/schema";
import { env } from "@/lib/env";
import { createStill, deletePair } from "@/lib/stills/mutations";
import { restoreRevision, reviewTechnique, submitTechnique, updateTechnique } from "@/lib/techniques/mutations";
import { sweepUploads } from "@/lib/stills/sweep";
import { newIncomingPath, variantPath } from "@/lib/stills/storage";
import { noisePng } from "./images";
import { createPerson, createTechnique, ctx, filesUnder, uploadRequest, type TestPerson } from "./factories";

let dir: string;
let artist: TestPerson;
let senior: TestPerson;
let lead: TestPerson;
let technique: { id: string; slug: string };

async function uploadStill(person: TestPerson, fields: Record<string, string>): Promise<string> {
  const res = await upload(uploadRequest({ bytes: await noisePng(16, 9), name: "p.png" }, { alt: "Plate", ...fields }, person.auth), ctx({}));
  const body = (await res.json()) as { id: string };
  if (res.status !== 201) throw new Error(JSON.stringify(body));
  return body.id;
}

function pairRequest(person: TestPerson, body: unknown): Request {
  return new Request("http://plateroom.test/api/stills/pairs", {
    method: "POST",
    body: JSON.stringify(body),
    headers: { ...person.auth, "content-type": "application/json" },
  });
}

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-pairs-"));
  env.PLATEROOM_UPLOADS_DIR = dir;
  [artist, senior, lead] = await Promise.all([createPerson("artist"), createPerson("senior"), createPerson("lead")]);
  technique = await createTechnique(senior.user, { approved: true });
});

afterAll(() => {
  fs.rmSync(dir, { recursive: true, force: true });
});

describe("before/after pairs", () => {
  it("a pair on an approved technique goes into a new draft revision: readers see it once a lead approves it; delete works the same way", async () => {
    // Both uploaded as "before", as the technique page's uploader does; pairing sets which is which.
    const before = await uploadStill(senior, { owner: "technique", technique: technique.slug, role: "before" });
    const after = await uploadStill(senior, { owner: "technique", technique: technique.slug, role: "before" });
    const res = await postPair(pairRequest(senior, { technique: technique.slug, before, after, caption: "Marker removal on SLM_040_0120" }), ctx({}));
    expect(res.status).toBe(201);
    const pair = (await res.json()) as { id: string; revision: number; before: { id: string; role: string }; after: { id: string; role: string }; position: number };
    expect(pair.before).toMatchObject({ id: before, role: "before" });
    expect(pair.after).toMatchObject({ id: after, role: "after" });
    // Revision 1 is approved: the pair belongs to a new draft revision 2.
    expect(pair.revision).toBe(2);

    const list = async (person: TestPerson) =>
      ((await (await listPairs(new Request(`http://plateroom.test/api/stills/pairs?technique=${technique.slug}`, { headers: person.auth }), ctx({}))).json()) as { items: { id: string; caption: string; revision: number }[] }).items;
    expect(await list(artist)).toEqual([]);
    expect((await list(senior)).map((i) => i.id)).toEqual([pair.id]);

    // A second pair goes into the same draft revision, not a third one.
    const third = await uploadStill(senior, { owner: "technique", technique: technique.slug });
    const second = (await (await postPair(pairRequest(senior, { technique: technique.slug, before: after, after: third }), ctx({}))).json()) as { revision: number };
    expect(second.revision).toBe(2);

    await submitTechnique(senior.user, technique.slug);
    await reviewTechnique(lead.user, technique.slug, { revision: 2, decision: "approve" });
    const items = await list(artist);
    expect(items.map((i) => i.id)[0]).toBe(pair.id);
    expect(items[0]).toMatchObject({ caption: "Marker removal on SLM_040_0120", revision: 2 });

    // Deleting from the approved revision 2 makes draft revision 3 without the pair; readers keep it until approval.
    const del = await deletePairRoute(new Request(`http://plateroom.test/api/stills/pairs/${pair.id}`, { method: "DELETE", headers: senior.auth }), ctx({ id: pair.id }));
    expect(del.status).toBe(204);
    expect((await list(artist)).map((i) => i.id)).toContain(pair.id);
    expect((await list(senior)).map((i) => i.caption)).not.toContain("Marker removal on SLM_040_0120");
    expect((await list(senior)).every((i) => i.revision === 3)).toBe(true);
    const again = await deletePairRoute(new Request(`http://plateroom.test/api/stills/pairs/${pair.id}`, { method: "DELETE", headers: senior.auth }), ctx({ id: pair.id }));
    expect(again.status).toBe(409);
    const missing = crypto.randomUUID();
    expect((await deletePairRoute(new Request(`http://plateroom.test/api/stills/pairs/${missing}`, { method: "DELETE", headers: senior.auth }), ctx({ id: missing }))).status).toBe(404);
  });

  it("a draft's pairs change in place, a saved revision starts with its base's pairs, and a restore brings back the restored revision's pairs", async () => {
    const draft = await createTechnique(senior.user, { approved: false });
    const a = await uploadStill(senior, { owner: "technique", technique: draft.slug });
    const b = await uploadStill(senior, { owner: "technique", technique: draft.slug });
    const made = (await (await postPair(pairRequest(senior, { technique: draft.slug, before: a, after: b }), ctx({}))).json()) as { revision: number };
    expect(made.revision).toBe(1);
    const content = { title: "Grain match after paint-out", summary: "Regrain a painted patch so it sits in the plate.", aliases: [], tags: [], recipe: [] };
    await updateTechnique(senior.user, draft.slug, { ...content, baseRevision: 1, changeNote: "Wording." });
    const pairsOf = async (n: number) =>
      getDb()
        .select({ before: stillPairs.beforeStillId, after: stillPairs.afterStillId })
        .from(stillPairs)
        .innerJoin(revisions, eq(revisions.id, stillPairs.revisionId))
        .where(and(eq(stillPairs.techniqueId, draft.id), eq(revisions.number, n)));
    expect(await pairsOf(2)).toEqual([{ before: a, after: b }]);
    // Revision 2 is a draft: removing its pair changes it in place.
    const [copy] = await getDb().select({ id: stillPairs.id }).from(stillPairs).innerJoin(revisions, eq(revisions.id, stillPairs.revisionId)).where(and(eq(stillPairs.techniqueId, draft.id), eq(revisions.number, 2)));
    await deletePair(senior.user, copy!.id);
    expect(await pairsOf(2)).toEqual([]);
    expect(await pairsOf(1)).toEqual([{ before: a, after: b }]);
    await restoreRevision(senior.user, draft.slug, 1, 2);
    expect(await pairsOf(3)).toEqual([{ before: a, after: b }]);
  });

  it("an artist may not make or delete pairs (403)", async () => {
    const a = await uploadStill(senior, { owner: "technique", technique: technique.slug });
    const b = await uploadStill(senior, { owner: "technique", technique: technique.slug });
    expect((await postPair(pairRequest(artist, { technique: technique.slug, before: a, after: b }), ctx({}))).status).toBe(403);
    const id = crypto.randomUUID();
    expect((await deletePairRoute(new Request(`http://plateroom.test/api/stills/pairs/${id}`, { method: "DELETE", headers: artist.auth }), ctx({ id }))).status).toBe(403);
  });

  it("a private trial or a still of another technique cannot be paired (400); same still twice is 400", async () => {
    const mine = await uploadStill(senior, { owner: "technique", technique: technique.slug });
    const trial = await uploadStill(senior, { owner: "trial" });
    const other = await createTechnique(senior.user, { approved: true });
    const foreign = await uploadStill(senior, { owner: "technique", technique: other.slug });
    for (const after of [trial, foreign, mine]) {
      const res = await postPair(pairRequest(senior, { technique: technique.slug, before: mine, after }), ctx({}));
      expect(res.status).toBe(400);
      expect(((await res.json()) as { error: { fields: Record<string, string> } }).error.fields.after).toBeTruthy();
    }
  });
});

describe("failure cleanup and the sweeper", () => {
  it("when the row cannot be written, the stored files are removed and no row remains", async () => {
    const bytes = await noisePng(9, 7);
    const sha = crypto.createHash("sha256").update(bytes).digest("hex");
    const temp = await newIncomingPath(dir);
    fs.writeFileSync(temp, bytes);
    // A person who is not in the users table: the uploader foreign key refuses the insert.
    const ghost = { id: crypto.randomUUID(), email: "ghost@kestrel.test", name: "Ghost", role: "senior" as const };
    await expect(createStill(ghost, { file: { path: temp, sha256: sha, size: bytes.length }, alt: "x", owner: "trial" }, { root: dir })).rejects.toThrow();
    expect(filesUnder(dir).filter((f) => f.includes(sha) || f.startsWith("tmp"))).toEqual([]);
    const [row] = await getDb().select({ n: count() }).from(stills).where(eq(stills.sha256, sha));
    expect(row?.n).toBe(0);
  });

  it("a failed row for content another row uses keeps the shared file", async () => {
    const bytes = await noisePng(11, 7);
    const sha = crypto.createHash("sha256").update(bytes).digest("hex");
    const res = await upload(uploadRequest({ bytes, name: "s.png" }, { alt: "x", owner: "trial" }, artist.auth), ctx({}));
    expect(res.status).toBe(201);
    const temp = await newIncomingPath(dir);
    fs.writeFileSync(temp, bytes);
    const ghost = { id: crypto.randomUUID(), email: "ghost2@kestrel.test", name: "Ghost", role: "senior" as const };
    await expect(createStill(ghost, { file: { path: temp, sha256: sha, size: bytes.length }, alt: "x", owner: "trial" }, { root: dir })).rejects.toThrow();
    expect(fs.existsSync(variantPath(sha, "original", dir))).toBe(true);
    expect(fs.existsSync(temp)).toBe(false);
  });

  it("sweeps unreferenced files and stale temp files past the grace period, keeps referenced ones", async () => {
    const keptId = await uploadStill(artist, { owner: "trial" });
    const [kept] = await getDb().select({ sha256: stills.sha256 }).from(stills).where(eq(stills.id, keptId));
    const orphanSha = crypto.createHash("sha256").update("orphan").digest("hex");
    const orphan = variantPath(orphanSha, "original", dir);
    fs.mkdirSync(path.dirname(orphan), { recursive: true });
    fs.writeFileSync(orphan, "left over");
    const staleTemp = await newIncomingPath(dir);
    fs.writeFileSync(staleTemp, "half an upload");

    const young = await sweepUploads({ root: dir });
    expect(young.removed).toEqual([]);

    const later = Date.now() + 2 * 60 * 60 * 1000;
    const result = await sweepUploads({ root: dir, now: later });
    expect(result.removed.sort()).toEqual([path.relative(dir, orphan), path.relative(dir, staleTemp)].sort());
    expect(fs.existsSync(variantPath(kept!.sha256, "original", dir))).toBe(true);
    expect(fs.existsSync(variantPath(kept!.sha256, "preview", dir))).toBe(true);
  });
});
