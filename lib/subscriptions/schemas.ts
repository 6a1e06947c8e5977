import { z } from "zod";

export const SUBSCRIPTION_KINDS = ["technique", "tag", "show"] as const;
export type SubscriptionKind = (typeof SUBSCRIPTION_KINDS)[number];
const MAIL_MODES = ["immediate", "daily"] as const;
export type MailMode = (typeof MAIL_MODES)[number];

/** A technique slug, a tag slug or a show code (shared/API.md, /api/subscriptions). */
const subscriptionTargetSchema = z.object({
  kind: z.enum(SUBSCRIPTION_KINDS),
  key: z.string().trim().min(1, "Name what to follow.").max(200),
});
export type SubscriptionTarget = z.infer<typeof subscriptionTargetSchema>;

const mailModeSchema = z.enum(MAIL_MODES);

/** POST /api/subscriptions; without `mode` the person's chosen mail mode applies. */
export const subscribeSchema = z.object({ target: subscriptionTargetSchema, mode: mailModeSchema.optional() });
export type SubscribeInput = z.infer<typeof subscribeSchema>;

/** DELETE /api/subscriptions (`mode` may be sent and is ignored). */
export const unsubscribeSchema = z.object({ target: subscriptionTargetSchema, mode: mailModeSchema.optional() });

export const setMailModeSchema = z.object({ mode: mailModeSchema });

export type SubscriptionResponse = {
  id: string;
  target: SubscriptionTarget;
  mode: MailMode;
  /** Technique title, tag name or show name, for lists and buttons. */
  label: string;
  createdAt: string;
};

export type SubscriptionListResponse = { items: SubscriptionResponse[]; mailMode: MailMode };
