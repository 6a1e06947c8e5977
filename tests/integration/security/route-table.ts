import type { Role } from "@/lib/auth/roles";

/*
 * Who may call what: every API route handler and every server action, in one table. Written
 * from lib/auth/permissions.ts (the role table and its ownership rules) and the handlers and
 * DAL functions they call. The technique ladder is artist < senior < lead; admin is separate
 * (people, outbox, audit) and otherwise reads like an artist.
 *
 * It is the single source for tests/integration/security/route-table.test.ts, which fails when
 * a route file exports a method this table does not list (or the other way round) and calls
 * every entry as signed out, artist, senior, lead and admin. Deny by default: a route that is
 * not here is a failing test, not an open door (OWASP ASVS 4.0.3 V4.1.1/V4.1.3, from memory).
 * Pure data, client-safe.
 */

export const HTTP_METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
export type HttpMethod = (typeof HTTP_METHODS)[number];

/** Rules where the resource decides, after the role gate (lib/auth/permissions.ts OWNERSHIP_RULES). */
export type OwnershipRule =
  /** Use logs: the person who logged it, or any lead ("use:edit"). */
  | "owner-or-lead"
  /** Answering a question: the technique's author or a lead ("question:answer"). */
  | "author-or-lead"
  /** Resolving a question: the asker, the technique's author, or a lead ("question:resolve"). */
  | "asker-author-or-lead"
  /** Personal API tokens: only one's own; anyone else's answers 404. */
  | "owner";

export type Access =
  /** No sign-in at all (Auth.js, health, unknown paths, the signed-token unsubscribe). */
  | "public"
  /** Any active person, whatever the role. */
  | "signed-in"
  /** The technique ladder: this role and above (admins are not on it). */
  | { minRole: "senior" | "lead" }
  /** Exactly these roles. */
  | { roles: readonly Role[] }
  | OwnershipRule;

export type RouteEntry = {
  /** As under app/, e.g. "/api/techniques/[slug]/review". */
  path: string;
  method: HttpMethod;
  access: Access;
  /**
   * Set for reads whose rows may be private trials: a trial still is its uploader's alone;
   * anyone else (leads and admins too) gets 404, so nobody learns it exists ("still:read").
   */
  trialStills?: { access: "owner"; deniedAs: 404 };
  /** How a refusal after the role gate answers, when not 403 (hidden as "not found"). */
  deniedAs?: 403 | 404;
  note?: string;
};

const SENIOR = { minRole: "senior" } as const;
const LEAD = { minRole: "lead" } as const;
const ADMIN = { roles: ["admin"] } as const;
const TRIAL = { access: "owner", deniedAs: 404 } as const;

const unknownNote = "Any unknown /api path: 404 in the API error shape, never the HTML page.";

export const ROUTE_TABLE: readonly RouteEntry[] = [
  // Catch-all and the framework's own routes.
  ...HTTP_METHODS.map((method): RouteEntry => ({ path: "/api/[...unknown]", method, access: "public", note: unknownNote })),
  { path: "/api/auth/[...nextauth]", method: "GET", access: "public", note: "Auth.js: csrf, session, providers." },
  { path: "/api/auth/[...nextauth]", method: "POST", access: "public", note: "Auth.js sign-in/out; credentials sign-in is rate limited." },
  { path: "/api/health", method: "GET", access: "public" },
  { path: "/api/password-resets", method: "POST", access: "public", note: "Same answer for every address; limited per e-mail and per client address." },
  { path: "/api/unsubscribe", method: "GET", access: "public", note: "Redirects to the confirmation page; changes nothing." },
  { path: "/api/unsubscribe", method: "POST", access: "public", note: "RFC 8058 one-click: the signed token in the URL is the only authority." },

  // Identity, tokens, people.
  { path: "/api/me", method: "GET", access: "signed-in" },
  { path: "/api/tokens", method: "GET", access: "signed-in", note: "Lists the caller's own tokens only." },
  { path: "/api/tokens", method: "POST", access: "signed-in" },
  { path: "/api/tokens/[id]", method: "DELETE", access: "owner", deniedAs: 404 },
  { path: "/api/people", method: "GET", access: ADMIN },
  { path: "/api/people", method: "POST", access: ADMIN },
  { path: "/api/people/[id]", method: "PATCH", access: ADMIN },

  // Mail administration.
  { path: "/api/admin/outbox", method: "GET", access: ADMIN },
  { path: "/api/admin/outbox/[id]", method: "GET", access: ADMIN },
  { path: "/api/admin/outbox/[id]/retry", method: "POST", access: ADMIN },
  { path: "/api/admin/inbox", method: "GET", access: ADMIN },
  { path: "/api/admin/inbox/[id]", method: "GET", access: ADMIN },
  { path: "/api/admin/audit", method: "GET", access: ADMIN, note: "audit:read" },

  // Techniques.
  { path: "/api/techniques", method: "GET", access: "signed-in", note: "Readers see approved techniques; seniors and leads drafts too." },
  { path: "/api/techniques", method: "POST", access: SENIOR },
  { path: "/api/techniques/[slug]", method: "GET", access: "signed-in", note: "Drafts are 404 to readers (artists, admins)." },
  { path: "/api/techniques/[slug]", method: "PUT", access: SENIOR },
  { path: "/api/techniques/[slug]/submit", method: "POST", access: SENIOR },
  { path: "/api/techniques/[slug]/review", method: "POST", access: LEAD },
  { path: "/api/techniques/[slug]/retire", method: "POST", access: LEAD },
  { path: "/api/techniques/[slug]/revisions", method: "GET", access: "signed-in", note: "Readers get the approved history only." },
  { path: "/api/techniques/[slug]/revisions/diff", method: "GET", access: "signed-in" },
  { path: "/api/techniques/[slug]/revisions/[number]/restore", method: "POST", access: SENIOR },
  { path: "/api/techniques/[slug]/questions", method: "GET", access: "signed-in" },
  { path: "/api/techniques/[slug]/questions", method: "POST", access: "signed-in" },
  { path: "/api/techniques/[slug]/uses", method: "GET", access: "signed-in" },
  { path: "/api/techniques/[slug]/uses", method: "POST", access: "signed-in", note: "Artists log uses of approved techniques only." },
  { path: "/api/review-queue", method: "GET", access: LEAD },
  { path: "/api/search", method: "GET", access: "signed-in", note: "Readers' results come from approved text only." },
  { path: "/api/search/suggest", method: "GET", access: "signed-in" },

  // Questions and requests.
  { path: "/api/questions/[id]/answers", method: "POST", access: "author-or-lead" },
  { path: "/api/questions/[id]/resolve", method: "POST", access: "asker-author-or-lead" },
  { path: "/api/requests", method: "GET", access: "signed-in", note: "?scope=open lists for seniors and leads; others get their own." },
  { path: "/api/requests", method: "POST", access: "signed-in" },
  { path: "/api/requests/[id]/claim", method: "POST", access: SENIOR },

  // Tags.
  { path: "/api/tags", method: "GET", access: "signed-in" },
  { path: "/api/tags", method: "POST", access: LEAD },
  { path: "/api/tags/[slug]", method: "PATCH", access: LEAD },
  { path: "/api/tags/[slug]/merge", method: "POST", access: LEAD },
  { path: "/api/tags/[slug]/house-method", method: "PUT", access: LEAD },

  // Shows, shots and use logs.
  { path: "/api/shows", method: "GET", access: "signed-in" },
  { path: "/api/shows", method: "POST", access: LEAD },
  { path: "/api/shows/[code]", method: "GET", access: "signed-in" },
  { path: "/api/shows/[code]", method: "PATCH", access: LEAD },
  { path: "/api/shows/[code]/shots", method: "GET", access: "signed-in" },
  { path: "/api/shows/[code]/shots", method: "POST", access: LEAD },
  { path: "/api/shots", method: "GET", access: "signed-in" },
  { path: "/api/shots/[code]", method: "GET", access: "signed-in" },
  { path: "/api/uses/[id]", method: "GET", access: "signed-in" },
  { path: "/api/uses/[id]", method: "PATCH", access: "owner-or-lead" },
  { path: "/api/uses/[id]", method: "DELETE", access: "owner-or-lead" },

  // Stills.
  {
    path: "/api/stills",
    method: "POST",
    access: "signed-in",
    note: "Anyone uploads private trials and use-log stills; technique stills need senior or lead (still:upload).",
  },
  { path: "/api/stills", method: "GET", access: "signed-in", note: "A technique's stills; others' trials are left out." },
  { path: "/api/stills/[id]", method: "GET", access: "signed-in", trialStills: TRIAL },
  { path: "/api/stills/[id]/[variant]", method: "GET", access: "signed-in", trialStills: TRIAL },
  { path: "/api/stills/[id]/pixel", method: "GET", access: "signed-in", trialStills: TRIAL },
  { path: "/api/stills/pairs", method: "GET", access: "signed-in" },
  { path: "/api/stills/pairs", method: "POST", access: SENIOR },
  { path: "/api/stills/pairs/[id]", method: "DELETE", access: SENIOR },

  // The lab: anyone signed in, on stills they may read.
  { path: "/api/lab/run", method: "POST", access: "signed-in", trialStills: TRIAL },
  { path: "/api/lab/analyse", method: "POST", access: "signed-in", trialStills: TRIAL },
  { path: "/api/lab/sample", method: "POST", access: "signed-in", trialStills: TRIAL },
  { path: "/api/lab/solve", method: "POST", access: "signed-in", note: "Numbers only; touches no still." },

  // Subscriptions.
  { path: "/api/subscriptions", method: "GET", access: "signed-in" },
  { path: "/api/subscriptions", method: "POST", access: "signed-in" },
  { path: "/api/subscriptions", method: "DELETE", access: "signed-in" },
  { path: "/api/subscriptions/mode", method: "PUT", access: "signed-in" },
];

export type ServerActionEntry = { file: string; name: string; access: Access; note?: string };

/** Server actions are public POST endpoints (STYLE.md §4): each one is listed with its authority. */
export const SERVER_ACTIONS: readonly ServerActionEntry[] = [
  { file: "lib/auth/actions.ts", name: "signInAction", access: "public", note: "Credentials checked, rate limited." },
  { file: "lib/auth/actions.ts", name: "signOutAction", access: "public", note: "Ends the caller's own sessions, if any." },
  { file: "lib/auth/actions.ts", name: "setPasswordAction", access: "public", note: "The single-use token from the mail is the authority." },
  { file: "lib/auth/actions.ts", name: "forgotPasswordAction", access: "public", note: "Same answer whether the address exists or not." },
  { file: "components/mail/unsubscribe-action.ts", name: "confirmUnsubscribeAction", access: "public", note: "The signed unsubscribe token is the authority." },
];

/** The roles that pass the role gate of `access` (ownership rules are then decided by the resource). */
export function rolesPassing(access: Access): readonly Role[] {
  if (access === "public" || access === "signed-in") return ["artist", "senior", "lead", "admin"];
  if (typeof access === "string") return ["artist", "senior", "lead", "admin"];
  if ("roles" in access) return access.roles;
  return access.minRole === "lead" ? ["lead"] : ["senior", "lead"];
}

export function isOwnershipRule(access: Access): access is OwnershipRule {
  return typeof access === "string" && access !== "public" && access !== "signed-in";
}

/** The route file for a table path, relative to the repository root. */
export function routeFileOf(path: string): string {
  return `app${path}/route.ts`;
}
