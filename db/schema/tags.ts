import { sql } from "drizzle-orm";
import { pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";

export const tagKindEnum = pgEnum("tag_kind", ["problem", "plate"]);

/** Problem tags (what is wrong in the plate) and plate tags (what the plate is); leads maintain both. */
export const tags = pgTable("tags", {
  id: uuid("id").primaryKey().defaultRandom(),
  kind: tagKindEnum("kind").notNull(),
  slug: text("slug").notNull().unique(),
  name: text("name").notNull(),
  description: text("description").notNull().default(""),
  /** Other words people use for the same thing, e.g. "tracker dots"; search reads them. */
  aliases: text("aliases").array().notNull().default(sql`'{}'::text[]`),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});
export type Tag = typeof tags.$inferSelect;
