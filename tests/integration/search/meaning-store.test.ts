import { count } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { revisions, searchMeaningVectors } from "@/db/schema";
import { meaningWarmed } from "@/lib/search";
import { MeaningVectors, meaningText } from "@/lib/search/meaning";
import { MEANING_MODEL_ID } from "@/lib/search/meaning-model";
import { databaseMeaningStore } from "@/lib/search/meaning-store";
import { createTechnique } from "@/lib/techniques/mutations";
import { rebuildSearchFromDb } from "@/lib/techniques/search-sync";
import { techniqueDocumentSchema } from "@/lib/techniques/document";
import { createPerson, createTag, simpleDoc } from "@/tests/factories";

// Page vectors for ranking by meaning kept in the database (our own cache design: no outside source).
// IEEE 754 single precision round-trips exactly through bytes, so stored vectors must come back equal.

const storedRows = async (): Promise<number> => (await getDb().select({ n: count() }).from(searchMeaningVectors))[0]?.n ?? 0;

describe("stored page vectors", () => {
  it("come back bit for bit, only for the encoder that made them, and are pruned to the texts still in use", async () => {
    const store = databaseMeaningStore("test encoder A");
    const v = Float32Array.from([0.6, -0.8, 1e-7, Math.fround(Math.PI)]);
    await store.save([
      ["Wire over sky. Paint the wire out.", v],
      ["Dust busting. Specks for one frame.", Float32Array.from([1, 0, 0, 0])],
    ]);
    // Saving again is harmless (another instance may have stored the same text).
    await store.save([["Wire over sky. Paint the wire out.", v]]);
    const back = await store.load(["Wire over sky. Paint the wire out.", "never stored"]);
    expect([...back.keys()]).toEqual(["Wire over sky. Paint the wire out."]);
    expect(back.get("Wire over sky. Paint the wire out.")).toEqual(v);
    expect((await databaseMeaningStore("test encoder B").load(["Wire over sky. Paint the wire out."])).size).toBe(0);
    await store.keepOnly(["Dust busting. Specks for one frame."]);
    expect([...(await store.load(["Wire over sky. Paint the wire out.", "Dust busting. Specks for one frame."])).keys()]).toEqual(["Dust busting. Specks for one frame."]);
  });
});

describe("a rebuild with the database", () => {
  beforeAll(async () => {
    const senior = await createPerson("senior");
    await createTag("problem", "Lens flare", ["flare"]);
    const pages: [title: string, summary: string][] = [
      ["Flare removal by a clean pass", "Take a flare off the action with a pass shot without the light."],
      ["Flare removal by painting on a still", "Paint one frame clean of the flare and track it through the shot."],
    ];
    for (const [title, summary] of pages)
      await createTechnique(senior, { title, summary, aliases: [], tags: ["lens-flare"], body: techniqueDocumentSchema.parse(simpleDoc(summary)), recipe: [] });
    await rebuildSearchFromDb();
    await meaningWarmed();
  });

  it("stores every page's vector, so the next start encodes none of them", async () => {
    expect(await storedRows()).toBe(2);
    const titles = await getDb().select({ title: revisions.title, summary: revisions.summary }).from(revisions);
    const texts = titles.map((r) => meaningText({ title: r.title, summary: r.summary, aliases: [], tags: [{ slug: "lens-flare", name: "Lens flare", kind: "problem", aliases: ["flare"] }] }));
    const encoded: string[] = [];
    const restarted = new MeaningVectors((t) => {
      encoded.push(...t);
      return Promise.resolve(t.map(() => new Float32Array(512)));
    });
    restarted.store = databaseMeaningStore(MEANING_MODEL_ID);
    await restarted.ensure(texts);
    expect(encoded).toEqual([]);
    expect(restarted.size).toBe(2);
    // The real encoder's unit vectors, as stored.
    for (const t of texts) expect(Math.hypot(...(restarted.get(t) as Float32Array))).toBeCloseTo(1, 5);
  });
});
