import "server-only";
import { forbidden, notFound } from "next/navigation";
import { isAppError } from "@/lib/api/errors";
import { can, type Permission } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";

/*
 * Pages answer with real status codes: 404 for what does not exist or may not be seen, 403 for a
 * page the role may not open. Both must run before the response starts streaming (no loading.tsx
 * above a page that calls them), or the status stays 200.
 */

/** Runs a DAL read for a page; "not found" (which also hides what a person may not see) becomes the 404 page, a refusal the 403 page. */
export async function loadOrNotFound<T>(load: () => Promise<T>): Promise<T> {
  try {
    return await load();
  } catch (error) {
    if (isAppError(error) && error.code === "not_found") notFound();
    if (isAppError(error) && error.code === "forbidden") forbidden();
    throw error;
  }
}

/** The "not for your role" page (403) unless the person's role has the permission. */
export function requirePagePermission(user: SessionUser, permission: Permission): void {
  if (!can(user, permission)) forbidden();
}
