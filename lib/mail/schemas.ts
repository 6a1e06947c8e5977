import { z } from "zod";

export const OUTBOX_STATES = ["queued", "sending", "sent", "failed"] as const;
export type OutboxState = (typeof OUTBOX_STATES)[number];

/** Query of GET /api/admin/outbox. */
export const listOutboxSchema = z.object({
  state: z.enum(OUTBOX_STATES).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
});
export type ListOutboxInput = z.infer<typeof listOutboxSchema>;

export type OutboxItemResponse = {
  id: number;
  to: string;
  toUserId: string | null;
  kind: string;
  subject: string;
  state: OutboxState;
  attempts: number;
  nextAttemptAt: string;
  lastError: string | null;
  createdAt: string;
  sentAt: string | null;
  messageId: string;
  headers: Record<string, string>;
  text: string;
  html: string;
};

export type OutboxListResponse = {
  items: OutboxItemResponse[];
  total: number;
  counts: Record<OutboxState, number>;
};

/** One message as the fake SMTP server received it (scripts/fake-smtp/server.ts), for the in-app mail view. */
export type InboxMessage = {
  id: string;
  receivedAt: string;
  envelope: { from: string | null; to: string[] };
  messageId: string | null;
  date: string | null;
  from: string;
  to: string;
  subject: string;
  text: string;
  html: string | null;
  /** Header values as received (unfolded, not decoded), keyed by lower-case name; repeated headers joined by ", ". */
  headers: Record<string, string>;
};
