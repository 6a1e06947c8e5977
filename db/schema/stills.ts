import { bigint, index, integer, pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { users } from "./people";
import { revisions, techniques } from "./techniques";

/** What a still belongs to decides who may see it (lib/auth/permissions.ts). */
export const stillOwnerEnum = pgEnum("still_owner", ["technique", "use", "trial"]);
export const stillRoleEnum = pgEnum("still_role", ["before", "after", "reference"]);

export const stills = pgTable(
  "stills",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    /** Content address of the original bytes under PLATEROOM_UPLOADS_DIR; identical uploads share it. */
    sha256: text("sha256").notNull(),
    width: integer("width").notNull(),
    height: integer("height").notNull(),
    format: text("format").notNull(),
    bitDepth: integer("bit_depth").notNull(),
    channels: integer("channels").notNull(),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
    originalName: text("original_name").notNull().default(""),
    uploaderId: uuid("uploader_id").references(() => users.id, { onDelete: "set null" }),
    alt: text("alt").notNull(),
    caption: text("caption").notNull().default(""),
    credit: text("credit").notNull().default(""),
    owner: stillOwnerEnum("owner").notNull(),
    role: stillRoleEnum("role").notNull().default("reference"),
    techniqueId: uuid("technique_id").references(() => techniques.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("stills_sha256").on(t.sha256), index("stills_technique").on(t.techniqueId)],
);
export type Still = typeof stills.$inferSelect;

/**
 * A before/after pair shown in the compare view of a technique page. Pairs belong to the revision
 * they were made in, like the text: a new revision starts with copies of its base's pairs, so a
 * changed pair goes through review and shows in the revision diff.
 */
export const stillPairs = pgTable(
  "still_pairs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    techniqueId: uuid("technique_id").notNull().references(() => techniques.id, { onDelete: "cascade" }),
    revisionId: uuid("revision_id")
      .notNull()
      .references(() => revisions.id, { onDelete: "cascade" }),
    beforeStillId: uuid("before_still_id").notNull().references(() => stills.id, { onDelete: "cascade" }),
    afterStillId: uuid("after_still_id").notNull().references(() => stills.id, { onDelete: "cascade" }),
    caption: text("caption").notNull().default(""),
    position: integer("position").notNull().default(0),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("still_pairs_revision").on(t.revisionId)],
);
export type StillPair = typeof stillPairs.$inferSelect;
