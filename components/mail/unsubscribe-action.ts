"use server";

import { isAppError } from "@/lib/api/errors";
import { applyUnsubscribe } from "@/lib/mail/unsubscribe";

export type UnsubscribeState = { status: "idle" } | { status: "done"; removed: number } | { status: "error"; message: string };

/**
 * The confirmation page's button: the same signed-token unsubscribe as the one-click POST,
 * with no session needed. A form post, so it works before (or without) JavaScript.
 */
export async function confirmUnsubscribeAction(_prev: UnsubscribeState, form: FormData): Promise<UnsubscribeState> {
  const token = form.get("token");
  if (typeof token !== "string" || !token) return { status: "error", message: "This unsubscribe link is not complete." };
  try {
    const result = await applyUnsubscribe(token);
    return { status: "done", removed: result.removed };
  } catch (error) {
    if (isAppError(error)) return { status: "error", message: error.message };
    console.error("[unsubscribe] failed:", error);
    return { status: "error", message: "Something went wrong on our side. Nothing was changed; please try again." };
  }
}
