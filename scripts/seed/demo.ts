import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { shots, shows, tags, users } from "@/db/schema";
import { DEMO_PASSWORD, DEMO_PEOPLE } from "@/scripts/seed/data/people";
import { DEMO_SHOWS } from "@/scripts/seed/data/shows";
import { DEMO_TAGS } from "@/scripts/seed/data/tags";
import { hashPassword } from "@/lib/auth/password";
import { seedTechniques } from "@/scripts/seed/techniques";

/** Default shot-code pattern: SHOW_SEQ_SHOT, e.g. SLM_040_0120 (common practice). */
function defaultShotPattern(code: string): string {
  return `^${code}_\\d{3}_\\d{4}$`;
}

/**
 * Loads the invented Kestrel Yard scenario. Idempotent: what exists already is left as it is,
 * so running it again (every `npm run demo`) changes nothing.
 */
export async function seedDemo(log: (line: string) => void = console.log): Promise<void> {
  const db = getDb();
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  let created = 0;
  for (const person of DEMO_PEOPLE) {
    const rows = await db.insert(users).values({ email: person.email, name: person.name, role: person.role, passwordHash }).onConflictDoNothing({ target: users.email }).returning({ id: users.id });
    created += rows.length;
  }
  log(`people: ${created} created, ${DEMO_PEOPLE.length - created} already there`);

  const tagRows = await db
    .insert(tags)
    .values(DEMO_TAGS.map((t) => ({ kind: t.kind, name: t.name, slug: t.slug, description: t.description, aliases: [...t.aliases] })))
    .onConflictDoNothing({ target: tags.slug })
    .returning({ id: tags.id });
  log(`tags: ${tagRows.length} created`);

  for (const show of DEMO_SHOWS) {
    await db.insert(shows).values({ code: show.code, name: show.name, kind: show.kind, shotPattern: defaultShotPattern(show.code) }).onConflictDoNothing({ target: shows.code });
    const [row] = await db.select({ id: shows.id }).from(shows).where(eq(shows.code, show.code));
    const shotRows = await db
      .insert(shots)
      .values(show.shots.map((s) => ({ showId: row!.id, code: s.code, sequence: s.sequence, description: s.description, frameStart: s.frameStart, frameEnd: s.frameEnd, state: s.state })))
      .onConflictDoNothing({ target: shots.code })
      .returning({ id: shots.id });
    log(`show ${show.code}: ${shotRows.length} shots created`);
  }

  await seedTechniques(log);
}
