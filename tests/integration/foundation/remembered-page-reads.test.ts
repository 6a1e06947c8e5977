import { describe, expect, it } from "vitest";
import { changeGeneration } from "@/db/change-watch";
import { currentDriver } from "@/db/client";
import { AppError } from "@/lib/api/errors";
import { createTechnique, reviewTechnique, submitTechnique, updateTechnique } from "@/lib/techniques/mutations";
import { techniqueForPage, outcomeCountsForPage } from "@/lib/techniques/page-data";
import { logUse } from "@/lib/uses/mutations";
import { createPeople, simpleDoc } from "@/tests/factories";
import { makeShot, makeShow } from "@/tests/integration/shots/factories";

/**
 * Issue 19: a technique page's reads are remembered per viewer until the next committed change
 * (lib/remembered-reads.ts, migration 0001's change stamp). What must hold on real PGlite: a write
 * by anyone shows on the very next read, and what a viewer may not see (a draft) stays 404 for
 * them even while someone allowed to see it has it remembered.
 */

async function watching(): Promise<boolean> {
  if (currentDriver() === "postgres") return false;
  for (let i = 0; i < 100; i++) {
    if (changeGeneration() !== null) return true;
    await new Promise((r) => setTimeout(r, 10));
  }
  throw new Error("the change watch never started listening");
}

async function notFoundFor(read: Promise<unknown>): Promise<string | undefined> {
  const error = await read.then(
    () => undefined,
    (e: unknown) => e,
  );
  return error instanceof AppError ? error.code : String(error);
}

const input = (title: string) => ({ title, summary: "Paint out the dots on a screen.", aliases: [], tags: [], body: simpleDoc(`Steps for ${title}.`), recipe: [] });

describe("technique page reads remembered until the next change", () => {
  it("shows an edit on the next read, keeps drafts from readers, and lets them in once approved", async () => {
    const people = await createPeople();
    const remembers = await watching();
    const { slug } = await createTechnique(people.senior, input("Dot paint-out on screens"));

    const first = await techniqueForPage(people.senior, slug);
    expect(first.title).toBe("Dot paint-out on screens");
    // Nothing changed: the same object comes back (remembered), on PGlite only.
    const again = await techniqueForPage(people.senior, slug);
    if (remembers) expect(again).toBe(first);
    else expect(again).not.toBe(first);

    // An artist may not see a draft (PRODUCT.md roles), even while the senior's copy is remembered.
    expect(await notFoundFor(techniqueForPage(people.artist, slug))).toBe("not_found");

    // A write is visible on the next read.
    await updateTechnique(people.senior, slug, { ...input("Dot paint-out on screens"), summary: "Edited summary.", baseRevision: 1, changeNote: "Clearer summary." });
    const edited = await techniqueForPage(people.senior, slug);
    expect(edited.summary).toBe("Edited summary.");
    expect(edited.revision.number).toBe(2);
    expect(await notFoundFor(techniqueForPage(people.artist, slug))).toBe("not_found");

    // Approved: the artist, refused a moment ago, now reads it (a refusal is never remembered).
    await submitTechnique(people.senior, slug);
    await reviewTechnique(people.lead, slug, { revision: 2, decision: "approve" });
    const asArtist = await techniqueForPage(people.artist, slug);
    expect(asArtist.summary).toBe("Edited summary.");
    expect(asArtist.approvedRevision).toBe(2);

    // Each viewer gets their own read: the senior sees the pending edit, the artist the approved revision.
    await updateTechnique(people.senior, slug, { ...input("Dot paint-out on screens"), summary: "Pending edit.", baseRevision: 2, changeNote: "Another pass." });
    expect((await techniqueForPage(people.senior, slug)).summary).toBe("Pending edit.");
    expect((await techniqueForPage(people.artist, slug)).summary).toBe("Edited summary.");
  });

  it("counts a use logged by someone else on the next read of the page's outcome counts", async () => {
    const people = await createPeople();
    await watching();
    const { slug } = await createTechnique(people.senior, input("Rig removal on sky"));
    await submitTechnique(people.senior, slug);
    await reviewTechnique(people.lead, slug, { revision: 1, decision: "approve" });
    const before = await outcomeCountsForPage(people.artist, slug);
    expect(before.total).toBe(0);
    const show = await makeShow("KYR");
    await makeShot(show.id, "KYR_010_0010");
    await logUse(people.senior, slug, { shot: "KYR_010_0010", outcome: "clean", note: "" });
    const after = await outcomeCountsForPage(people.artist, slug);
    expect(after).toEqual({ clean: 1, "touch-up": 0, failed: 0, total: 1 });
  });
});
