import { sql } from "drizzle-orm";
import { bigserial, index, integer, jsonb, pgEnum, pgTable, text, timestamp, unique, uuid } from "drizzle-orm/pg-core";
import { mailModeEnum, users } from "./people";

export const subscriptionKindEnum = pgEnum("subscription_kind", ["technique", "tag", "show"]);

export const subscriptions = pgTable(
  "subscriptions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    kind: subscriptionKindEnum("kind").notNull(),
    /** Technique slug, tag slug or show code. */
    key: text("key").notNull(),
    mode: mailModeEnum("mode").notNull().default("immediate"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("subscriptions_user_target").on(t.userId, t.kind, t.key)],
);
export type Subscription = typeof subscriptions.$inferSelect;

export const outboxStateEnum = pgEnum("outbox_state", ["queued", "sending", "sent", "failed"]);

/** Mail written in the same transaction as the change that caused it; the sender drains it. */
export const outbox = pgTable(
  "outbox",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    toEmail: text("to_email").notNull(),
    toUserId: uuid("to_user_id").references(() => users.id, { onDelete: "set null" }),
    kind: text("kind").notNull(),
    subject: text("subject").notNull(),
    text: text("text").notNull(),
    html: text("html").notNull(),
    headers: jsonb("headers").$type<Record<string, string>>().notNull().default(sql`'{}'::jsonb`),
    /** Fixed when queued so a retry after a lost acknowledgement carries the same Message-ID. */
    messageId: text("message_id").notNull().unique(),
    state: outboxStateEnum("state").notNull().default("queued"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    lastError: text("last_error"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp("sent_at", { withTimezone: true }),
  },
  (t) => [index("outbox_state_next").on(t.state, t.nextAttemptAt)],
);
export type OutboxMessage = typeof outbox.$inferSelect;

/** Events waiting for a person's daily digest. */
export const digestItems = pgTable(
  "digest_items",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    userId: uuid("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    kind: text("kind").notNull(),
    title: text("title").notNull(),
    summary: text("summary").notNull().default(""),
    link: text("link").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    /** Set when the item went into a digest; the outbox row carries the message itself. */
    digestedAt: timestamp("digested_at", { withTimezone: true }),
  },
  (t) => [index("digest_items_pending").on(t.userId, t.digestedAt)],
);
