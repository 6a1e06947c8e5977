import { index, integer, pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { users } from "./people";
import { revisions, techniques } from "./techniques";
import { stills } from "./stills";

export const showKindEnum = pgEnum("show_kind", ["feature", "series", "commercial", "other"]);
export const showStateEnum = pgEnum("show_state", ["active", "wrapped"]);
/** Our own words for where a shot stands in paint and prep. */
export const shotStateEnum = pgEnum("shot_state", ["waiting", "in_prep", "cleaned", "on_hold"]);
export const outcomeEnum = pgEnum("use_outcome", ["clean", "touch-up", "failed"]);

export const shows = pgTable("shows", {
  id: uuid("id").primaryKey().defaultRandom(),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  kind: showKindEnum("kind").notNull().default("feature"),
  state: showStateEnum("state").notNull().default("active"),
  /** Regular expression a shot code must match; SHOW_SEQ_SHOT by default (common practice). */
  shotPattern: text("shot_pattern").notNull(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});
export type Show = typeof shows.$inferSelect;

export const shots = pgTable(
  "shots",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    showId: uuid("show_id").notNull().references(() => shows.id, { onDelete: "cascade" }),
    code: text("code").notNull().unique(),
    sequence: text("sequence").notNull(),
    description: text("description").notNull().default(""),
    frameStart: integer("frame_start"),
    frameEnd: integer("frame_end"),
    state: shotStateEnum("state").notNull().default("waiting"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("shots_show").on(t.showId)],
);
export type Shot = typeof shots.$inferSelect;

/** A record that a technique was used on a shot, and how it went. */
export const uses = pgTable(
  "uses",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    techniqueId: uuid("technique_id").notNull().references(() => techniques.id, { onDelete: "cascade" }),
    revisionId: uuid("revision_id").references(() => revisions.id, { onDelete: "set null" }),
    shotId: uuid("shot_id").notNull().references(() => shots.id, { onDelete: "cascade" }),
    userId: uuid("user_id").references(() => users.id, { onDelete: "set null" }),
    outcome: outcomeEnum("outcome").notNull(),
    note: text("note").notNull().default(""),
    beforeStillId: uuid("before_still_id").references(() => stills.id, { onDelete: "set null" }),
    afterStillId: uuid("after_still_id").references(() => stills.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("uses_technique").on(t.techniqueId), index("uses_shot").on(t.shotId)],
);
export type Use = typeof uses.$inferSelect;
