import { index, integer, jsonb, pgTable, text, timestamp, unique, uuid } from "drizzle-orm/pg-core";
import { users } from "./people";
import { stills } from "./stills";
import { techniques } from "./techniques";

/*
 * The plate check (issue 18): what was measured on a still, the techniques tried on it, and the
 * filled recipes people kept. Rows follow their still's visibility (a private trial's checks are
 * its owner's and the leads'); shapes are lib/plate-check/schemas.ts.
 */

/** The newest findings for a still; replaced when re-run (a newer detector version re-runs it). */
export const plateChecks = pgTable("plate_checks", {
  stillId: uuid("still_id").primaryKey().references(() => stills.id, { onDelete: "cascade" }),
  detectorVersion: integer("detector_version").notNull(),
  findings: jsonb("findings").$type<unknown>().notNull(),
  checkedById: uuid("checked_by_id").references(() => users.id, { onDelete: "set null" }),
  checkedAt: timestamp("checked_at", { withTimezone: true }).notNull().defaultNow(),
});
export type PlateCheck = typeof plateChecks.$inferSelect;

/** A technique's recipe filled from the findings and rendered on the still, with what it did. */
export const plateCheckTries = pgTable(
  "plate_check_tries",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    stillId: uuid("still_id").notNull().references(() => stills.id, { onDelete: "cascade" }),
    techniqueId: uuid("technique_id").notNull().references(() => techniques.id, { onDelete: "cascade" }),
    revisionNumber: integer("revision_number").notNull(),
    detectorVersion: integer("detector_version").notNull(),
    result: jsonb("result").$type<unknown>().notNull(),
    position: integer("position").notNull().default(0),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("plate_check_tries_still_technique").on(t.stillId, t.techniqueId)],
);
export type PlateCheckTry = typeof plateCheckTries.$inferSelect;

/** A filled recipe someone kept for themselves, on the still it was filled for. */
export const keptRecipes = pgTable(
  "kept_recipes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    stillId: uuid("still_id").notNull().references(() => stills.id, { onDelete: "cascade" }),
    ownerId: uuid("owner_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    techniqueId: uuid("technique_id").references(() => techniques.id, { onDelete: "set null" }),
    /** Title and revision as they were when kept (the technique may change or go). */
    techniqueTitle: text("technique_title").notNull(),
    techniqueSlug: text("technique_slug").notNull(),
    revisionNumber: integer("revision_number").notNull(),
    recipe: jsonb("recipe").$type<unknown[]>().notNull(),
    note: text("note").notNull().default(""),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("kept_recipes_still_owner").on(t.stillId, t.ownerId)],
);
export type KeptRecipe = typeof keptRecipes.$inferSelect;
