import { sql } from "drizzle-orm";
import { pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { users } from "./people";

export const thesaurusKindEnum = pgEnum("thesaurus_kind", ["synonyms", "narrower"]);

/**
 * The trade thesaurus search applies at query time; leads keep it. A "synonyms" entry makes its
 * terms mean each other; a "narrower" entry makes each term also find `broader` (one way).
 */
export const thesaurusEntries = pgTable("thesaurus_entries", {
  id: uuid("id").primaryKey().defaultRandom(),
  kind: thesaurusKindEnum("kind").notNull(),
  /** Narrower entries only: the broader term its terms also mean. */
  broader: text("broader"),
  /** Lower-case words or phrases. */
  terms: text("terms").array().notNull().default(sql`'{}'::text[]`),
  note: text("note").notNull().default(""),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  updatedById: uuid("updated_by_id").references(() => users.id, { onDelete: "set null" }),
});
export type ThesaurusEntryRow = typeof thesaurusEntries.$inferSelect;
