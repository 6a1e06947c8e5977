/*
 * The audit log in words: each entry becomes a sentence with names and links ("Ines Varrow
 * approved revision 3 of Marker channel cleanup."). Pure and client-safe; the server resolves
 * ids to names first (lib/audit/queries.ts).
 */

/** A piece of a sentence: plain words, or a name that links somewhere. */
export type SentencePart = string | { text: string; href?: string };

/** What an entry's ids stand for, resolved by the server. Missing ones read as "a removed …". */
export type AuditNames = {
  actor: { name: string } | null;
  technique?: { title: string; slug: string } | null;
  tag?: { name: string; slug: string; kind: "problem" | "plate" } | null;
  show?: { code: string; name: string } | null;
  person?: { name: string } | null;
  shot?: { code: string } | null;
};

type AuditEntryInput = { action: string; detail: Record<string, unknown> };

type Area = "Techniques" | "Review" | "Department methods" | "Stills" | "Tags" | "Shows and shots" | "Questions and requests" | "People and sign-in" | "Mail and following" | "Thesaurus";

/** Every action the log records, with the words the filter shows. */
export const AUDIT_ACTIONS: Record<string, { area: Area; label: string }> = {
  "technique.create": { area: "Techniques", label: "Started a technique" },
  "technique.edit": { area: "Techniques", label: "Saved a revision" },
  "technique.retire": { area: "Techniques", label: "Retired a technique" },
  "plate-check.propose": { area: "Techniques", label: "Proposed recipe values from a plate check" },
  "technique.submit": { area: "Review", label: "Submitted for review" },
  "technique.approve": { area: "Review", label: "Approved a revision" },
  "technique.return": { area: "Review", label: "Sent a revision back" },
  "tag.house-method.set": { area: "Department methods", label: "Chose a department method" },
  "tag.house-method.clear": { area: "Department methods", label: "Cleared a department method" },
  "still.upload": { area: "Stills", label: "Uploaded a still" },
  "still.share": { area: "Stills", label: "Shared a trial still with a use log" },
  "still_pair.create": { area: "Stills", label: "Added a before/after pair" },
  "still_pair.delete": { area: "Stills", label: "Removed a before/after pair" },
  "tag.create": { area: "Tags", label: "Added a tag" },
  "tag.update": { area: "Tags", label: "Changed a tag" },
  "tag.merge": { area: "Tags", label: "Merged tags" },
  "show.create": { area: "Shows and shots", label: "Added a show" },
  "show.update": { area: "Shows and shots", label: "Changed a show" },
  "shots.import": { area: "Shows and shots", label: "Imported a shot list" },
  "use.update": { area: "Shows and shots", label: "Changed a use log" },
  "use.delete": { area: "Shows and shots", label: "Deleted a use log" },
  "question.ask": { area: "Questions and requests", label: "Asked a question" },
  "question.answer": { area: "Questions and requests", label: "Answered a question" },
  "question.resolve": { area: "Questions and requests", label: "Marked a question resolved" },
  "request.create": { area: "Questions and requests", label: "Asked for a write-up" },
  "request.claim": { area: "Questions and requests", label: "Took on a write-up request" },
  "person.invite": { area: "People and sign-in", label: "Invited someone" },
  "person.update": { area: "People and sign-in", label: "Changed a role or account" },
  "person.password.invite": { area: "People and sign-in", label: "Set a first password" },
  "person.password.reset": { area: "People and sign-in", label: "Reset a password" },
  "token.create": { area: "People and sign-in", label: "Made an API token" },
  "token.revoke": { area: "People and sign-in", label: "Revoked an API token" },
  "subscription.mail-mode": { area: "Mail and following", label: "Chose how to get mail" },
  "subscription.unsubscribe-link": { area: "Mail and following", label: "Unsubscribed from a mail link" },
  "mail.retry": { area: "Mail and following", label: "Sent a message again" },
  "thesaurus.create": { area: "Thesaurus", label: "Added a thesaurus entry" },
  "thesaurus.update": { area: "Thesaurus", label: "Changed a thesaurus entry" },
  "thesaurus.delete": { area: "Thesaurus", label: "Removed a thesaurus entry" },
};

/** The filter's choices: areas in a fixed order, each with its actions. */
export function auditActionGroups(): { area: Area; actions: { action: string; label: string }[] }[] {
  const groups = new Map<Area, { action: string; label: string }[]>();
  for (const [action, { area, label }] of Object.entries(AUDIT_ACTIONS)) groups.set(area, [...(groups.get(area) ?? []), { action, label }]);
  return [...groups].map(([area, actions]) => ({ area, actions }));
}

const str = (v: unknown): string | null => (typeof v === "string" && v.trim() !== "" ? v : null);
const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
const quote = (text: string, max = 140) => `“${text.length > max ? `${text.slice(0, max - 1)}…` : text}”`;
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

function techniqueRef(names: AuditNames): SentencePart {
  return names.technique ? { text: names.technique.title, href: `/techniques/${names.technique.slug}` } : "a removed technique";
}
function tagRef(names: AuditNames): SentencePart {
  const t = names.tag;
  if (!t) return "a removed tag";
  return { text: t.name, href: t.kind === "problem" ? `/problems/${t.slug}` : undefined };
}
function showRef(names: AuditNames): SentencePart {
  return names.show ? { text: `${names.show.code} · ${names.show.name}`, href: `/shows/${names.show.code}` } : "a removed show";
}
function personRef(names: AuditNames): SentencePart {
  return names.person ? { text: names.person.name, href: "/people" } : "someone since removed";
}
function revisionOf(detail: Record<string, unknown>): string {
  const n = num(detail.revision);
  return n === null ? "a revision" : `revision ${n}`;
}
/** A technique the detail names as `{ slug, title }` (the title it had then); entries written before titles were kept hold just the slug. */
function slugRef(value: unknown): SentencePart | null {
  if (value && typeof value === "object" && "slug" in value) {
    const v = value as { slug?: unknown; title?: unknown };
    const slug = str(v.slug);
    if (slug) return { text: str(v.title) ?? slug, href: `/techniques/${slug}` };
  }
  const slug = str(value);
  return slug ? { text: slug, href: `/techniques/${slug}` } : null;
}

/** A thesaurus entry in words: "tracker, dot → marker" for narrower terms, "regrain = grain restore" for synonyms. */
function thesaurusWords(value: unknown): string {
  const v = (value && typeof value === "object" ? value : {}) as { kind?: unknown; broader?: unknown; terms?: unknown };
  const terms = Array.isArray(v.terms) ? v.terms.filter((t): t is string => typeof t === "string") : [];
  const broader = str(v.broader);
  if (terms.length === 0) return "an entry";
  return quote(v.kind === "narrower" && broader ? `${terms.join(", ")} → ${broader}` : terms.join(" = "));
}
const thesaurusPage: SentencePart = { text: "thesaurus", href: "/thesaurus" };

/** The words after the actor's name, ending in a full stop. */
function predicate(entry: AuditEntryInput, names: AuditNames): SentencePart[] {
  const d = entry.detail;
  const technique = techniqueRef(names);
  switch (entry.action) {
    case "technique.create":
      return ["started the technique ", technique, "."];
    case "technique.edit": {
      const note = str(d.changeNote);
      return [`saved ${revisionOf(d)} of `, technique, note ? `: ${quote(note)}` : "."];
    }
    case "plate-check.propose":
      return [`saved ${revisionOf(d)} of `, technique, " with recipe values filled from a checked frame."];
    case "technique.submit":
      return [`submitted ${revisionOf(d)} of `, technique, " for review."];
    case "technique.approve":
      return [`approved ${revisionOf(d)} of `, technique, "."];
    case "technique.return": {
      const note = str(d.note);
      return [`sent ${revisionOf(d)} of `, technique, note ? ` back: ${quote(note)}` : " back."];
    }
    case "technique.retire": {
      const by = slugRef(d.supersededBy);
      const note = str(d.note);
      return ["retired ", technique, ...(by ? [", replaced by ", by] : []), note ? `: ${quote(note)}` : "."];
    }
    case "tag.house-method.set": {
      const chosen = slugRef({ slug: d.technique, title: d.title }) ?? "a technique";
      const replaced = slugRef(d.replaced);
      return ["made ", chosen, " the department method for ", tagRef(names), ...(replaced ? [", in place of ", replaced] : []), "."];
    }
    case "tag.house-method.clear": {
      const replaced = slugRef(d.replaced);
      return ["cleared the department method for ", tagRef(names), ...(replaced ? [" (it was ", replaced, ")"] : []), "."];
    }
    case "still.upload": {
      if (names.technique) return ["uploaded a still to ", technique, "."];
      return [d.owner === "use" ? "uploaded a still for a use log." : d.owner === "trial" ? "uploaded a still to try in the lab." : "uploaded a still."];
    }
    case "still.share":
      return ["shared a still they had tried in the lab with a use log."];
    case "still_pair.create":
      return [`added a before/after pair to ${revisionOf(d)} of `, technique, "."];
    case "still_pair.delete":
      return [`removed a before/after pair from ${revisionOf(d)} of `, technique, "."];
    case "tag.create":
      return [`added the ${d.kind === "plate" ? "plate" : "problem"} tag `, tagRef(names), "."];
    case "tag.update":
      return ["changed the tag ", tagRef(names), "."];
    case "tag.merge":
      return [`merged the tag ${quote(str(d.from) ?? "?")} into `, tagRef(names), "."];
    case "show.create":
      return ["added the show ", showRef(names), "."];
    case "show.update":
      return ["changed the show ", showRef(names), "."];
    case "shots.import": {
      const problems = num(d.errors) ?? 0;
      const counts = `${plural(num(d.created) ?? 0, "shot")} added, ${num(d.updated) ?? 0} updated`;
      return ["imported a shot list into ", showRef(names), `: ${counts}${problems ? `, ${plural(problems, "row")} left out with problems` : ""}.`];
    }
    case "use.update":
      return ["changed a use log", ...(names.technique ? [" of ", technique] : []), "."];
    case "use.delete":
      return ["deleted the log of ", technique, ...(names.shot ? [" on ", { text: names.shot.code, href: `/shots/${names.shot.code}` }] : []), "."];
    case "question.ask":
      return ["asked a question on ", technique, "."];
    case "question.answer":
      return ["answered a question on ", technique, "."];
    case "question.resolve":
      return ["marked a question on ", technique, " resolved."];
    case "request.create":
      return [`asked for a write-up: ${quote(str(d.query) ?? "")}.`];
    case "request.claim":
      return ["took on a write-up request."];
    case "person.invite":
      return ["invited ", personRef(names), str(d.role) ? ` as ${str(d.role)}.` : "."];
    case "person.update":
      return ["changed ", personRef(names), `: ${accountChange(d)}.`];
    case "person.password.invite":
      return ["set a first password from the invitation."];
    case "person.password.reset":
      return ["reset their password with a mailed link."];
    case "token.create":
      return [`made an API token ${quote(str(d.name) ?? "")}.`];
    case "token.revoke":
      return ["revoked an API token."];
    case "subscription.mail-mode":
      return [d.mode === "daily" ? "chose one daily digest for mail." : "chose mail at once."];
    case "subscription.unsubscribe-link":
      return ["unsubscribed with the link in a message."];
    case "mail.retry":
      return ["sent a failed message again."];
    case "thesaurus.create":
      return ["added ", thesaurusWords(d), " to the ", thesaurusPage, "."];
    case "thesaurus.update":
      return ["changed ", thesaurusWords(d.before), " in the ", thesaurusPage, " to ", thesaurusWords(d.after), "."];
    case "thesaurus.delete":
      return ["removed ", thesaurusWords(d), " from the ", thesaurusPage, "."];
    default:
      return [`did something the log has no words for (${entry.action}).`];
  }
}

function accountChange(d: Record<string, unknown>): string {
  const from = (d.from ?? {}) as { role?: unknown; disabled?: unknown };
  const to = (d.to ?? {}) as { role?: unknown; disabled?: unknown };
  const changes: string[] = [];
  if (from.role !== to.role && str(to.role)) changes.push(`role ${str(from.role) ?? "?"} → ${str(to.role)}`);
  if (from.disabled !== to.disabled) changes.push(to.disabled ? "account disabled" : "account enabled again");
  return changes.length ? changes.join(", ") : "no visible change";
}

/** One audit entry as a sentence, starting with who did it. */
export function describeAuditEntry(entry: AuditEntryInput, names: AuditNames): SentencePart[] {
  const actor: SentencePart = names.actor ? { text: names.actor.name } : "The system";
  return [actor, " ", ...predicate(entry, names)];
}

/** The sentence as plain text (for tests and titles). */
export function sentenceText(parts: SentencePart[]): string {
  return parts.map((p) => (typeof p === "string" ? p : p.text)).join("");
}
