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

export type FieldDiff = { field: RevisionField; label: string; segments: DiffSegment[] };

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
