import "server-only";
import { and, eq, inArray, isNull, or, type SQL } from "drizzle-orm";
import type { Database } from "@/db/client";
import { digestItems, shots, shows, subscriptions, tags, techniques, users, uses } from "@/db/schema";
import { baseUrl } from "@/lib/env";
import { enqueueMail, type Tx } from "@/lib/mail/outbox";
import { departmentMethodMail, newUnderTagMail, personalMail, revisionApprovedMail, techniqueRetiredMail, type MailContent } from "@/lib/mail/templates";
import type { UnsubscribeTarget } from "@/lib/mail/unsubscribe";

export type EventTechnique = { slug: string; title: string; tagSlugs: string[]; summary?: string };

/** People who hear of the event in a message of their own (the revision's author) and so not as followers. */
type Skips = { skipUserIds?: string[] };

export type TechniqueEvent = Skips &
  (
  | {
      kind: "revision-approved";
      actorId: string;
      technique: EventTechnique;
      revisionNumber: number;
      previousApprovedNumber: number | null;
      changeNote: string;
    }
  | {
      kind: "technique-retired";
      actorId: string;
      technique: EventTechnique;
      supersededBy: { slug: string; title: string } | null;
      note: string | null;
    }
  /** A technique's first approval: people following its tags hear of it. */
  | { kind: "new-approved-under-tag"; actorId: string; technique: EventTechnique }
  );

export type PersonEventKind = "question-answered" | "request-resolved" | "question-asked" | "revision-reviewed" | "review-waiting";

/** Something that concerns one person directly; `title`, `summary` and `link` are its digest line. */
export type PersonEvent = {
  kind: PersonEventKind;
  actorId: string;
  toUserId: string;
  title: string;
  link: string;
  summary: string;
  /** The message for immediate mail, written to the person's name; the answered/resolved kinds have a default. */
  mail?: (name: string) => MailContent;
};

type SubKind = "technique" | "tag" | "show";
type Match = { kind: SubKind; key: string; mode: "immediate" | "daily" };
type Recipient = { id: string; email: string; name: string; matches: Match[] };

export function techniqueUrl(slug: string): string {
  return `${baseUrl()}/techniques/${encodeURIComponent(slug)}`;
}

export function diffUrl(slug: string, from: number, to: number): string {
  return `${techniqueUrl(slug)}/history?from=${from}&to=${to}`;
}

// The most specific subscription explains the mail and is the one its unsubscribe link removes.
const SPECIFICITY: Record<SubKind, number> = { technique: 0, show: 1, tag: 2 };

/** Show codes of the shows where the technique was used on at least one shot. */
async function showCodesFor(tx: Tx, slug: string): Promise<string[]> {
  const rows = await tx
    .select({ code: shows.code })
    .from(uses)
    .innerJoin(techniques, eq(uses.techniqueId, techniques.id))
    .innerJoin(shots, eq(uses.shotId, shots.id))
    .innerJoin(shows, eq(shots.showId, shows.id))
    .where(eq(techniques.slug, slug));
  return [...new Set(rows.map((r) => r.code))];
}

/** Everyone following the technique, one of its tags or one of its shows, once each, minus the actor and disabled people. */
async function resolveSubscribers(tx: Tx, event: TechniqueEvent): Promise<Recipient[]> {
  const { technique } = event;
  const targets: SQL[] = [and(eq(subscriptions.kind, "technique"), eq(subscriptions.key, technique.slug))!];
  if (technique.tagSlugs.length > 0) targets.push(and(eq(subscriptions.kind, "tag"), inArray(subscriptions.key, technique.tagSlugs))!);
  if (event.kind !== "new-approved-under-tag") {
    const codes = await showCodesFor(tx, technique.slug);
    if (codes.length > 0) targets.push(and(eq(subscriptions.kind, "show"), inArray(subscriptions.key, codes))!);
  }
  const rows = await tx
    .select({
      userId: users.id,
      email: users.email,
      name: users.name,
      disabledAt: users.disabledAt,
      kind: subscriptions.kind,
      key: subscriptions.key,
      mode: subscriptions.mode,
    })
    .from(subscriptions)
    .innerJoin(users, eq(subscriptions.userId, users.id))
    .where(or(...targets));
  const byPerson = new Map<string, Recipient>();
  const skipped = new Set([event.actorId, ...(event.skipUserIds ?? [])]);
  for (const row of rows) {
    if (skipped.has(row.userId) || row.disabledAt) continue;
    const person = byPerson.get(row.userId) ?? { id: row.userId, email: row.email, name: row.name, matches: [] };
    person.matches.push({ kind: row.kind, key: row.key, mode: row.mode });
    byPerson.set(row.userId, person);
  }
  for (const person of byPerson.values()) person.matches.sort((a, b) => SPECIFICITY[a.kind] - SPECIFICITY[b.kind] || a.key.localeCompare(b.key));
  return [...byPerson.values()];
}

async function namesFor(tx: Tx, tagSlugs: string[], showCodes: string[]) {
  const tagNames = new Map<string, string>();
  const showNames = new Map<string, string>();
  if (tagSlugs.length > 0) {
    for (const t of await tx.select({ slug: tags.slug, name: tags.name }).from(tags).where(inArray(tags.slug, tagSlugs))) tagNames.set(t.slug, t.name);
  }
  if (showCodes.length > 0) {
    for (const s of await tx.select({ code: shows.code, name: shows.name }).from(shows).where(inArray(shows.code, showCodes))) showNames.set(s.code, s.name);
  }
  return { tagNames, showNames };
}

/**
 * Tells subscribers about a technique event, inside the caller's transaction: per person either
 * one immediate message or one digest item. Immediate wins when any matching subscription asks for it.
 */
export async function notifyTechniqueEvent(tx: Pick<Database, "insert" | "select">, event: TechniqueEvent): Promise<void> {
  const recipients = await resolveSubscribers(tx, event);
  if (recipients.length === 0) return;
  const matched = recipients.flatMap((r) => r.matches);
  const { tagNames, showNames } = await namesFor(
    tx,
    [...new Set(matched.filter((m) => m.kind === "tag").map((m) => m.key))],
    [...new Set(matched.filter((m) => m.kind === "show").map((m) => m.key))],
  );
  const reasonFor = (m: Match): string => {
    if (m.kind === "technique") return `You get this because you follow the technique "${event.technique.title}".`;
    if (m.kind === "tag") return `You get this because you follow the tag "${tagNames.get(m.key) ?? m.key}".`;
    const show = showNames.get(m.key);
    return `You get this because you follow the show ${m.key}${show ? ` (${show})` : ""}.`;
  };
  const url = techniqueUrl(event.technique.slug);

  for (const person of recipients) {
    const primary = person.matches[0]!;
    const immediate = person.matches.some((m) => m.mode === "immediate");
    const unsubscribe: UnsubscribeTarget = { userId: person.id, kind: primary.kind, key: primary.key };
    let content: MailContent;
    let digest: { title: string; summary: string; link: string };

    if (event.kind === "revision-approved") {
      const diff = event.previousApprovedNumber !== null ? diffUrl(event.technique.slug, event.previousApprovedNumber, event.revisionNumber) : null;
      content = revisionApprovedMail({
        name: person.name,
        technique: event.technique,
        revisionNumber: event.revisionNumber,
        changeNote: event.changeNote,
        techniqueUrl: url,
        diffUrl: diff,
        reason: reasonFor(primary),
      });
      digest = { title: `${event.technique.title}: revision ${event.revisionNumber} approved`, summary: event.changeNote, link: diff ?? url };
    } else if (event.kind === "technique-retired") {
      const replacement = event.supersededBy ? { ...event.supersededBy, url: techniqueUrl(event.supersededBy.slug) } : null;
      content = techniqueRetiredMail({
        name: person.name,
        technique: event.technique,
        supersededBy: replacement,
        note: event.note,
        techniqueUrl: url,
        reason: reasonFor(primary),
      });
      digest = {
        title: replacement ? `${event.technique.title} replaced by ${replacement.title}` : `${event.technique.title} retired`,
        summary: event.note ?? "",
        link: replacement?.url ?? url,
      };
    } else {
      const tagMatch = person.matches.find((m) => m.kind === "tag");
      const tagName = tagMatch ? (tagNames.get(tagMatch.key) ?? tagMatch.key) : (event.technique.tagSlugs[0] ?? "a tag you follow");
      content = newUnderTagMail({ name: person.name, technique: event.technique, tagName, techniqueUrl: url, reason: reasonFor(primary) });
      digest = { title: `New under ${tagName}: ${event.technique.title}`, summary: event.technique.summary ?? "", link: url };
    }

    if (immediate) {
      await enqueueMail(tx, { to: person, kind: event.kind, content, unsubscribe });
    } else {
      await tx.insert(digestItems).values({ userId: person.id, kind: event.kind, ...digest });
    }
  }
}

/**
 * Mail to one person about something that concerns them directly (their question, their request,
 * their revision, a review waiting for them): immediate or a digest line, by their mail setting.
 * Nobody hears of their own action.
 */
export async function notifyPerson(tx: Pick<Database, "insert" | "select">, event: PersonEvent): Promise<void> {
  if (event.toUserId === event.actorId) return;
  const [person] = await tx
    .select({ id: users.id, email: users.email, name: users.name, mailMode: users.mailMode, disabledAt: users.disabledAt })
    .from(users)
    .where(eq(users.id, event.toUserId))
    .limit(1);
  if (!person || person.disabledAt) return;
  if (person.mailMode === "daily") {
    await tx.insert(digestItems).values({ userId: person.id, kind: event.kind, title: event.title, summary: event.summary, link: event.link });
    return;
  }
  const content = event.mail
    ? event.mail(person.name)
    : personalMail({ name: person.name, kind: event.kind === "request-resolved" ? "request-resolved" : "question-answered", title: event.title, link: event.link, summary: event.summary });
  await enqueueMail(tx, { to: person, kind: event.kind, content });
}

/** The same event to several people (each once, never the actor). */
export async function notifyPeople(tx: Pick<Database, "insert" | "select">, toUserIds: (string | null | undefined)[], event: Omit<PersonEvent, "toUserId">): Promise<void> {
  for (const id of new Set(toUserIds.filter((x): x is string => Boolean(x)))) await notifyPerson(tx, { ...event, toUserId: id });
}

/** Every lead who may review (enabled, not the actor) hears of a submitted revision. */
export async function notifyLeads(tx: Pick<Database, "insert" | "select">, event: Omit<PersonEvent, "toUserId">): Promise<void> {
  const leads = await tx
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.role, "lead"), isNull(users.disabledAt)));
  await notifyPeople(
    tx,
    leads.map((l) => l.id),
    event,
  );
}

export type DepartmentMethodEvent = {
  actorId: string;
  actorName: string;
  tag: { slug: string; name: string };
  technique: { slug: string; title: string };
  replaced: { slug: string; title: string } | null;
};

/** Followers of a problem hear that its department method changed (immediate or digest, as they chose). */
export async function notifyDepartmentMethod(tx: Pick<Database, "insert" | "select">, event: DepartmentMethodEvent): Promise<void> {
  const rows = await tx
    .select({ id: users.id, email: users.email, name: users.name, disabledAt: users.disabledAt, mode: subscriptions.mode })
    .from(subscriptions)
    .innerJoin(users, eq(subscriptions.userId, users.id))
    .where(and(eq(subscriptions.kind, "tag"), eq(subscriptions.key, event.tag.slug)));
  const technique = { ...event.technique, url: techniqueUrl(event.technique.slug) };
  const replaced = event.replaced ? { ...event.replaced, url: techniqueUrl(event.replaced.slug) } : null;
  for (const person of rows) {
    if (person.id === event.actorId || person.disabledAt) continue;
    if (person.mode === "daily") {
      await tx.insert(digestItems).values({
        userId: person.id,
        kind: "department-method",
        title: `${event.tag.name}: ${technique.title} is the department method`,
        summary: replaced ? `In place of ${replaced.title}.` : "",
        link: technique.url,
      });
      continue;
    }
    const content = departmentMethodMail({
      name: person.name,
      problem: event.tag.name,
      technique,
      replaced,
      lead: event.actorName,
      reason: `You get this because you follow the problem "${event.tag.name}".`,
    });
    await enqueueMail(tx, { to: person, kind: "department-method", content, unsubscribe: { userId: person.id, kind: "tag", key: event.tag.slug } });
  }
}
