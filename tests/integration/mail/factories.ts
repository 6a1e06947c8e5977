import crypto from "node:crypto";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { revisions, shots, shows, subscriptions, tags, techniques, users, uses } from "@/db/schema";
import type { Role } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/roles";

// Small local factories for the mail tests; demo names are invented (Kestrel Yard).
const uid = () => crypto.randomBytes(4).toString("hex");

export async function makeUser(o: { name?: string; role?: Role; mailMode?: "immediate" | "daily"; disabled?: boolean } = {}): Promise<SessionUser> {
  const id = uid();
  const [u] = await getDb()
    .insert(users)
    .values({
      email: `person-${id}@kestrel.test`,
      name: o.name ?? `Person ${id}`,
      role: o.role ?? "artist",
      mailMode: o.mailMode ?? "immediate",
      disabledAt: o.disabled ? new Date() : null,
    })
    .returning();
  return { id: u!.id, email: u!.email, name: u!.name, role: u!.role };
}

export async function makeTag(o: { slug?: string; name?: string } = {}) {
  const id = uid();
  const [t] = await getDb()
    .insert(tags)
    .values({ kind: "problem", slug: o.slug ?? `tag-${id}`, name: o.name ?? `Tag ${id}` })
    .returning();
  return t!;
}

/** A technique with one revision; approved by default. */
export async function makeTechnique(o: { slug?: string; title?: string; tagIds?: string[]; status?: "draft" | "approved"; authorId?: string } = {}) {
  const db = getDb();
  const id = uid();
  const [t] = await db
    .insert(techniques)
    .values({ slug: o.slug ?? `technique-${id}`, status: o.status ?? "approved", createdById: o.authorId ?? null })
    .returning();
  const [r] = await db
    .insert(revisions)
    .values({
      techniqueId: t!.id,
      number: 1,
      title: o.title ?? `Technique ${id}`,
      summary: "A summary.",
      tagIds: o.tagIds ?? [],
      body: { type: "doc", content: [] },
      state: o.status === "draft" ? "draft" : "approved",
      authorId: o.authorId ?? null,
    })
    .returning();
  await db
    .update(techniques)
    .set({ latestRevisionId: r!.id, approvedRevisionId: o.status === "draft" ? null : r!.id })
    .where(eq(techniques.id, t!.id));
  return { ...t!, title: r!.title };
}

export async function makeShow(o: { code: string; name: string }) {
  const [s] = await getDb()
    .insert(shows)
    .values({ code: o.code, name: o.name, shotPattern: `^${o.code}_[0-9]{3}_[0-9]{4}$` })
    .returning();
  return s!;
}

/** Records that the technique was used on a new shot of the show. */
export async function makeUse(o: { techniqueId: string; showId: string; shotCode: string }) {
  const db = getDb();
  const [shot] = await db
    .insert(shots)
    .values({ showId: o.showId, code: o.shotCode, sequence: o.shotCode.split("_")[1] ?? "000" })
    .returning();
  await db.insert(uses).values({ techniqueId: o.techniqueId, shotId: shot!.id, outcome: "clean" });
  return shot!;
}

export async function follow(userId: string, kind: "technique" | "tag" | "show", key: string, mode: "immediate" | "daily" = "immediate") {
  await getDb().insert(subscriptions).values({ userId, kind, key, mode });
}
