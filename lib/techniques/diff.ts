import { diffWordsWithSpace } from "diff";

/*
 * Word-level diffs for the revision history, on the `diff` package (Myers' O(ND) algorithm).
 * Client-safe: the history page may compute diffs in the browser.
 */

export type DiffSegment = { kind: "same" | "added" | "removed"; text: string };

/**
 * Word diff of two texts. Whitespace runs and newlines are tokens too, so joining the "same" and
 * "removed" segments gives back fromText exactly, and "same" plus "added" gives toText.
 */
export function wordDiff(fromText: string, toText: string): DiffSegment[] {
  const segments: DiffSegment[] = [];
  for (const change of diffWordsWithSpace(fromText, toText)) {
    const kind = change.added ? "added" : change.removed ? "removed" : "same";
    const last = segments.at(-1);
    if (last && last.kind === kind) last.text += change.value;
    else if (change.value !== "") segments.push({ kind, text: change.value });
  }
  return segments;
}

/** What a revision diff compares: tags by name, the body as plain text. */
export type RevisionSnapshot = {
  title: string;
  summary: string;
  aliases: readonly string[];
  tags: readonly string[];
  bodyText: string;
  recipe: unknown;
};

type RevisionField = "title" | "summary" | "aliases" | "tags" | "bodyText" | "recipe";

/** A still as a diff shows it: a thumbnail with its description. */
export type DiffStill = { id: string; alt: string };

export type FieldDiff = {
  field: RevisionField;
  label: string;
  segments: DiffSegment[];
  /** Body only: each still in the text is one private-use character, a key here (shown as a thumbnail). */
  stills?: Record<string, DiffStill>;
};

/** A before/after pair added, removed or re-captioned between two revisions. */
export type PairChange = { change: "added" | "removed" | "captioned"; before: DiffStill; after: DiffStill; caption: string; previousCaption?: string };

/** First character of the Unicode private use area: still tokens in a diffed body are made from here on. */
export const STILL_TOKEN_BASE = 0xe000;
export const STILL_TOKEN = /[\uE000-\uF8FF]/u;

type PairLike = { before: DiffStill; after: DiffStill; caption: string };

/** Pair changes from a to b; a pair is the same pair when it shows the same two stills. */
export function diffPairs(a: readonly PairLike[], b: readonly PairLike[]): PairChange[] {
  const key = (p: PairLike) => `${p.before.id}>${p.after.id}`;
  const older = new Map(a.map((p) => [key(p), p]));
  const newer = new Map(b.map((p) => [key(p), p]));
  const changes: PairChange[] = [];
  for (const p of b) {
    const was = older.get(key(p));
    if (!was) changes.push({ change: "added", before: p.before, after: p.after, caption: p.caption });
    else if (was.caption !== p.caption) changes.push({ change: "captioned", before: p.before, after: p.after, caption: p.caption, previousCaption: was.caption });
  }
  for (const p of a) if (!newer.has(key(p))) changes.push({ change: "removed", before: p.before, after: p.after, caption: p.caption });
  return changes;
}

const FIELD_LABELS: Record<RevisionField, string> = {
  title: "Title",
  summary: "Summary",
  aliases: "Aliases",
  tags: "Tags",
  bodyText: "Body",
  recipe: "Parameters",
};

function sortKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortKeys);
  if (typeof value === "object" && value !== null) {
    return Object.fromEntries(
      Object.keys(value)
        .sort()
        .map((k) => [k, sortKeys((value as Record<string, unknown>)[k])]),
    );
  }
  return value;
}

/** Pretty JSON with sorted keys: the database (jsonb) does not keep key order. */
export function recipeText(recipe: unknown): string {
  if (recipe === undefined || recipe === null) return "";
  return JSON.stringify(sortKeys(recipe), null, 2);
}

function fieldText(snapshot: RevisionSnapshot, field: RevisionField): string {
  switch (field) {
    case "aliases":
      return snapshot.aliases.join("\n");
    case "tags":
      // Tag order carries no meaning.
      return [...snapshot.tags].sort((x, y) => x.localeCompare(y)).join("\n");
    case "recipe":
      return recipeText(snapshot.recipe);
    default:
      return snapshot[field];
  }
}

/** Changed fields between two revisions (a = older, b = newer), each with word-level segments. */
export function diffRevisions(a: RevisionSnapshot, b: RevisionSnapshot): FieldDiff[] {
  const fields = Object.keys(FIELD_LABELS) as RevisionField[];
  return fields.flatMap((field) => {
    const from = fieldText(a, field);
    const to = fieldText(b, field);
    if (from === to) return [];
    return [{ field, label: FIELD_LABELS[field], segments: wordDiff(from, to) }];
  });
}
