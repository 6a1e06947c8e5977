import { AppError } from "@/lib/api/errors";
import type { Role, SessionUser } from "@/lib/auth/roles";

/**
 * Every action the server guards. Route handlers, server actions and DAL functions call
 * `can()` / `assertCan()` for themselves; the interface uses `can()` only to hide controls.
 */
export const PERMISSIONS = [
  "technique:read",
  "technique:read-working",
  "technique:write",
  "technique:submit",
  "technique:review",
  "technique:retire",
  "technique:set-house-method",
  "tag:manage",
  "show:manage",
  "use:log",
  "use:edit",
  "question:ask",
  "question:answer",
  "question:resolve",
  "request:create",
  "request:claim",
  "still:upload",
  "still:upload-trial",
  "still:read",
  "lab:run",
  "subscription:manage",
  "token:manage",
  "people:manage",
  "mail:read-outbox",
  "audit:read",
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const ARTIST: Permission[] = [
  "technique:read",
  "use:log",
  "use:edit",
  "question:ask",
  "question:answer",
  "question:resolve",
  "request:create",
  "still:upload-trial",
  "still:read",
  "lab:run",
  "subscription:manage",
  "token:manage",
];
const SENIOR: Permission[] = [
  ...ARTIST,
  "technique:read-working",
  "technique:write",
  "technique:submit",
  "request:claim",
  "still:upload",
];
const LEAD: Permission[] = [
  ...SENIOR,
  "technique:review",
  "technique:retire",
  "technique:set-house-method",
  "tag:manage",
  "show:manage",
];
/** Admins run the installation (people, mail, audit) and otherwise read like artists (shared/PRODUCT.md, roles). */
const ADMIN: Permission[] = [...ARTIST, "people:manage", "mail:read-outbox", "audit:read"];

export const ROLE_PERMISSIONS: Record<Role, ReadonlySet<Permission>> = {
  artist: new Set(ARTIST),
  senior: new Set(SENIOR),
  lead: new Set(LEAD),
  admin: new Set(ADMIN),
};

/** What a check may need to know about the thing acted on, for rules that depend on ownership. */
type Resource = {
  /** Who owns it: the author of a use log or question, the uploader of a still. */
  ownerId?: string | null;
  /** For stills: a private trial is visible to its uploader only, until shared (e.g. on a use log). */
  stillOwner?: "technique" | "use" | "trial";
  /** For answering a question: the technique's author may answer as well as leads. */
  techniqueAuthorId?: string | null;
};

/** Rules where the role table alone is not enough: "own, or a lead". */
const OWNERSHIP_RULES: Partial<Record<Permission, (user: SessionUser, resource: Resource) => boolean>> = {
  "use:edit": (user, r) => r.ownerId === user.id || user.role === "lead",
  "question:resolve": (user, r) => r.ownerId === user.id || r.techniqueAuthorId === user.id || user.role === "lead",
  "question:answer": (user, r) => r.techniqueAuthorId === user.id || user.role === "lead",
  // Not leads, not admins: a trial is someone's own experiment until they attach it somewhere.
  "still:read": (user, r) => r.stillOwner !== "trial" || r.ownerId === user.id,
};

/** Deny by default: a missing user, an unknown role or a missing permission is a no. */
export function can(user: SessionUser | null | undefined, permission: Permission, resource?: Resource): boolean {
  if (!user) return false;
  const allowed = ROLE_PERMISSIONS[user.role];
  if (!allowed || !allowed.has(permission)) return false;
  const rule = OWNERSHIP_RULES[permission];
  // An ownership rule without the resource to judge cannot say yes.
  if (rule) return resource ? rule(user, resource) : false;
  return true;
}

/** Throws 403 unless `user` may do `permission` (on `resource`, for ownership rules). */
export function assertCan(user: SessionUser, permission: Permission, resource?: Resource): void {
  if (!can(user, permission, resource)) throw new AppError("forbidden");
}
