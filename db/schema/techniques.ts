import { sql } from "drizzle-orm";
import { integer, jsonb, pgEnum, pgTable, text, timestamp, unique, uuid, type AnyPgColumn } from "drizzle-orm/pg-core";
import { users } from "./people";
import { tags } from "./tags";

export const techniqueStatusEnum = pgEnum("technique_status", ["draft", "in_review", "approved", "retired"]);
/** Where one revision stands in review: written, waiting for a lead, accepted, or sent back. */
export const revisionStateEnum = pgEnum("revision_state", ["draft", "in_review", "approved", "returned"]);

export const techniques = pgTable("techniques", {
  id: uuid("id").primaryKey().defaultRandom(),
  slug: text("slug").notNull().unique(),
  status: techniqueStatusEnum("status").notNull().default("draft"),
  /** Newest revision, whatever its state. */
  latestRevisionId: uuid("latest_revision_id"),
  /** The revision readers see; null until the first approval. */
  approvedRevisionId: uuid("approved_revision_id"),
  createdById: uuid("created_by_id").references(() => users.id, { onDelete: "set null" }),
  supersededById: uuid("superseded_by_id").references((): AnyPgColumn => techniques.id, { onDelete: "set null" }),
  retiredAt: timestamp("retired_at", { withTimezone: true }),
  retiredById: uuid("retired_by_id").references(() => users.id, { onDelete: "set null" }),
  retireNote: text("retire_note"),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  lastApprovedAt: timestamp("last_approved_at", { withTimezone: true }),
});
export type Technique = typeof techniques.$inferSelect;

/** Slugs a technique had before a rename, so old links keep working. */
export const techniqueSlugHistory = pgTable("technique_slug_history", {
  slug: text("slug").primaryKey(),
  techniqueId: uuid("technique_id").notNull().references(() => techniques.id, { onDelete: "cascade" }),
});

export const revisions = pgTable(
  "revisions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    techniqueId: uuid("technique_id").notNull().references(() => techniques.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    title: text("title").notNull(),
    summary: text("summary").notNull(),
    aliases: text("aliases").array().notNull().default(sql`'{}'::text[]`),
    tagIds: uuid("tag_ids").array().notNull().default(sql`'{}'::uuid[]`),
    /** The editor's JSON document, validated against lib/techniques/document.ts. */
    body: jsonb("body").$type<unknown>().notNull(),
    bodyText: text("body_text").notNull().default(""),
    /** Ordered lab steps (lib/lab/recipe.ts); approval pins them with the text. */
    recipe: jsonb("recipe").$type<unknown[]>().notNull().default(sql`'[]'::jsonb`),
    changeNote: text("change_note").notNull().default(""),
    state: revisionStateEnum("state").notNull().default("draft"),
    authorId: uuid("author_id").references(() => users.id, { onDelete: "set null" }),
    reviewedById: uuid("reviewed_by_id").references(() => users.id, { onDelete: "set null" }),
    reviewedAt: timestamp("reviewed_at", { withTimezone: true }),
    reviewNote: text("review_note"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("revisions_technique_number").on(t.techniqueId, t.number)],
);
export type Revision = typeof revisions.$inferSelect;

/** The department's approved method for a problem tag: at most one technique per tag. */
export const houseMethods = pgTable("house_methods", {
  tagId: uuid("tag_id").primaryKey().references(() => tags.id, { onDelete: "cascade" }),
  techniqueId: uuid("technique_id").notNull().references(() => techniques.id, { onDelete: "cascade" }),
  setById: uuid("set_by_id").references(() => users.id, { onDelete: "set null" }),
  setAt: timestamp("set_at", { withTimezone: true }).notNull().defaultNow(),
});

export const questions = pgTable("questions", {
  id: uuid("id").primaryKey().defaultRandom(),
  techniqueId: uuid("technique_id").notNull().references(() => techniques.id, { onDelete: "cascade" }),
  authorId: uuid("author_id").references(() => users.id, { onDelete: "set null" }),
  body: jsonb("body").$type<unknown>().notNull(),
  bodyText: text("body_text").notNull().default(""),
  resolvedAt: timestamp("resolved_at", { withTimezone: true }),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export const answers = pgTable("answers", {
  id: uuid("id").primaryKey().defaultRandom(),
  questionId: uuid("question_id").notNull().references(() => questions.id, { onDelete: "cascade" }),
  authorId: uuid("author_id").references(() => users.id, { onDelete: "set null" }),
  body: jsonb("body").$type<unknown>().notNull(),
  bodyText: text("body_text").notNull().default(""),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export const requestStatusEnum = pgEnum("request_status", ["open", "claimed", "resolved"]);

/** A search that found nothing, turned into a request for a write-up. */
export const techniqueRequests = pgTable("technique_requests", {
  id: uuid("id").primaryKey().defaultRandom(),
  query: text("query").notNull(),
  note: text("note").notNull().default(""),
  status: requestStatusEnum("status").notNull().default("open"),
  requesterId: uuid("requester_id").references(() => users.id, { onDelete: "set null" }),
  claimedById: uuid("claimed_by_id").references(() => users.id, { onDelete: "set null" }),
  resolvedByTechniqueId: uuid("resolved_by_technique_id").references(() => techniques.id, { onDelete: "set null" }),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  resolvedAt: timestamp("resolved_at", { withTimezone: true }),
});
