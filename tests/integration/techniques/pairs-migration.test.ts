import fs from "node:fs";
import path from "node:path";
import { asc, eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { revisions, stillPairs, stills, techniques } from "@/db/schema";
import { makeTechnique, makeUser } from "@/tests/integration/mail/factories";

/*
 * Issue 13, item 6: before/after pairs made before they belonged to revisions keep working. The
 * data migration is run here on rows shaped as they were before it (no revision), in this file's
 * own database.
 */

/** A migration's SQL by its name (numbers may change when branches merge), split at drizzle's breakpoints. */
function migration(name: string): string[] {
  const dir = path.resolve("db/migrations");
  const file = fs.readdirSync(dir).find((f) => f.endsWith(`_${name}.sql`));
  if (!file) throw new Error(`no migration ${name}`);
  return fs.readFileSync(path.join(dir, file), "utf8").split("--> statement-breakpoint");
}

async function still(uploaderId: string, techniqueId: string, alt: string): Promise<string> {
  const [s] = await getDb()
    .insert(stills)
    .values({ sha256: alt.padEnd(64, "0"), width: 4, height: 4, format: "png", bitDepth: 8, channels: 3, sizeBytes: 10, uploaderId, alt, owner: "technique", techniqueId })
    .returning({ id: stills.id });
  return s!.id;
}

describe("pairs migration", () => {
  it("puts old pairs on the approved revision (else the newest) and copies them onto newer revisions", async () => {
    const db = getDb();
    const author = await makeUser({ role: "senior" });
    // A: approved revision 1 plus a pending draft 2 and 3. B: a draft only.
    const a = await makeTechnique({ authorId: author.id });
    const b = await makeTechnique({ authorId: author.id, status: "draft" });
    const [r1] = await db.select().from(revisions).where(eq(revisions.techniqueId, a.id));
    let latestId = r1!.id;
    for (const number of [2, 3]) {
      const { id: _id, ...rest } = r1!;
      const [made] = await db.insert(revisions).values({ ...rest, number, state: "draft" }).returning({ id: revisions.id });
      latestId = made!.id;
    }
    await db.update(techniques).set({ latestRevisionId: latestId }).where(eq(techniques.id, a.id));

    await db.execute(sql`ALTER TABLE "still_pairs" ALTER COLUMN "revision_id" DROP NOT NULL`);
    const [x, y, z] = [await still(author.id, a.id, "x"), await still(author.id, a.id, "y"), await still(author.id, b.id, "z")];
    const w = await still(author.id, b.id, "w");
    await db.execute(sql`INSERT INTO "still_pairs" ("technique_id", "before_still_id", "after_still_id", "caption", "position") VALUES (${a.id}, ${x}, ${y}, 'marker gone', 0), (${b.id}, ${z}, ${w}, '', 0)`);

    for (const statement of [...migration("still_pairs_onto_current_revisions"), ...migration("still_pairs_revision_required")]) await db.execute(sql.raw(statement));

    const rows = await db
      .select({ technique: stillPairs.techniqueId, revision: revisions.number, before: stillPairs.beforeStillId, caption: stillPairs.caption })
      .from(stillPairs)
      .innerJoin(revisions, eq(revisions.id, stillPairs.revisionId))
      .orderBy(asc(revisions.number));
    expect(rows.filter((r) => r.technique === a.id)).toEqual([
      { technique: a.id, revision: 1, before: x, caption: "marker gone" },
      { technique: a.id, revision: 2, before: x, caption: "marker gone" },
      { technique: a.id, revision: 3, before: x, caption: "marker gone" },
    ]);
    expect(rows.filter((r) => r.technique === b.id)).toEqual([{ technique: b.id, revision: 1, before: z, caption: "" }]);
    // The column is required again.
    await expect(db.execute(sql`INSERT INTO "still_pairs" ("technique_id", "before_still_id", "after_still_id") VALUES (${b.id}, ${z}, ${w})`)).rejects.toThrow();
  });
});
