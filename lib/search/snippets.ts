/**
 * What a result shows of why it matched: highlight ranges per field, a body excerpt around the
 * densest run of matched words, and which query words matched only through the thesaurus.
 * Highlight ranges come from the same tokenizer and stems as the index, so they mark exactly the
 * words that matched.
 */
import type { Alternative, QueryPlan } from "./query";
import { isThesaurusKind, isWordNetKind } from "./scoring";
import type { SearchDocument, SearchField, SearchMatch, SearchVia } from "./types";
import { tokenize, type Token } from "./text";

export const SNIPPET_CHARS = 180;

/** Cut `text` at word boundaries around `[from, to)`, marking cuts with "…". */
export function excerpt(text: string, from: number, to: number): { text: string; shift: number } {
  let s = Math.max(0, from);
  let e = Math.min(text.length, to);
  if (s > 0) {
    const sp = text.indexOf(" ", s);
    if (sp >= 0 && sp < s + 20) s = sp + 1;
  }
  if (e < text.length) {
    const sp = text.lastIndexOf(" ", e);
    if (sp > s + 40) e = sp;
  }
  const pre = s > 0 ? "…" : "";
  const post = e < text.length ? "…" : "";
  return { text: pre + text.slice(s, e).replace(/\s+$/, "") + post, shift: pre.length - s };
}

type StemOf = (word: string) => string;

/**
 * What a query matched, in the forms highlighting needs: the stems, the page words that have those
 * stems (so most tokens are checked by one set lookup), and whether some stem exists only as a
 * run-together pair ("bluescreen"), which needs adjacent tokens checked too.
 */
export type MatchedWords = { stems: ReadonlySet<string>; words: ReadonlySet<string>; hasPairs: boolean; stemOf: StemOf; bodyPattern?: RegExp | null };

/** Ranges of the tokens (and adjacent pairs written apart, "blue screen" for "bluescreen") whose stem matched. */
function rangesOf(text: string, m: MatchedWords, camel = false): [number, number][] {
  const toks = tokenize(text, camel);
  const out: [number, number][] = [];
  // Every page token is a vocabulary surface, so the matched stems' surfaces are all it takes.
  const hit = (w: string): boolean => m.words.has(w);
  toks.forEach((t, i) => {
    if (hit(t.word)) out.push([t.start, t.end]);
    else for (const p of t.parts ?? []) if (hit(p.word)) out.push([p.start, p.end]);
    const next = toks[i + 1];
    if (m.hasPairs && next && next.start - t.end === 1 && m.stems.has(m.stemOf(t.word + next.word))) out.push([t.start, next.end]);
  });
  return out;
}

const escapeRegExp = (w: string): string => w.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

/** Matched body words in order. Plain ASCII bodies are scanned by one regular expression of the matched words. */
function bodyHits(body: string, m: MatchedWords): { tokens: Token[]; stems: string[] } {
  const tokens: Token[] = [];
  const stems: string[] = [];
  // Made once per query; a hyphen counts as a boundary, so "busting" is found in "dust-busting".
  m.bodyPattern ??= m.words.size > 0 && m.words.size <= 500 ? new RegExp(`(?<![A-Za-z0-9'])(?:${[...m.words].map(escapeRegExp).join("|")})(?![A-Za-z0-9'])`, "gi") : null;
  const re = m.bodyPattern;
  if (re && /^[\x00-\x7f]*$/.test(body)) {
    re.lastIndex = 0;
    for (let x = re.exec(body); x !== null; x = re.exec(body)) {
      const word = x[0].toLowerCase();
      tokens.push({ word, start: x.index, end: x.index + x[0].length });
      stems.push(m.stemOf(word));
    }
    return { tokens, stems };
  }
  for (const t of tokenize(body)) {
    // By word, not stem: a quoted thesaurus term's stem is matched but only its own words are marked.
    if (!m.words.has(t.word)) continue;
    tokens.push(t);
    stems.push(m.stemOf(t.word));
  }
  return { tokens, stems };
}

/** Highlight ranges per field and the body snippet for one document and what a query matched. */
export function matchesFor(doc: SearchDocument, m: MatchedWords): { matches: SearchMatch[]; snippet: string } {
  const matches: SearchMatch[] = [];
  const single = (field: SearchField, value: string, camel = false): void => {
    const ranges = rangesOf(value, m, camel);
    if (ranges.length > 0) matches.push({ field, value, ranges });
  };
  single("title", doc.title);
  for (const a of doc.aliases) single("aliases", a);
  for (const t of doc.tags) for (const v of [t.name, ...t.aliases]) single("tags", v);
  single("summary", doc.summary);
  for (const p of doc.parameterNames) single("parameters", p, true);
  for (const s of doc.shotCodes) single("shots", s);

  const { tokens: bodyTokens, stems: bodyStems } = bodyHits(doc.bodyText, m);
  if (bodyTokens.length === 0) return { matches, snippet: excerpt(doc.summary, 0, SNIPPET_CHARS).text };
  // The window holding the most distinct matched words reads best.
  let bestStart = (bodyTokens[0] as Token).start;
  let bestCount = 0;
  for (let i = 0; i < bodyTokens.length && i < 200; i++) {
    const from = (bodyTokens[i] as Token).start;
    const seen = new Set<string>();
    for (let j = i; j < bodyTokens.length && (bodyTokens[j] as Token).end <= from + SNIPPET_CHARS - 40; j++) seen.add(bodyStems[j] as string);
    if (seen.size > bestCount) {
      bestCount = seen.size;
      bestStart = from;
    }
  }
  const cut = excerpt(doc.bodyText, bestStart - 40, bestStart - 40 + SNIPPET_CHARS);
  const lo = cut.text.startsWith("…") ? 1 : 0;
  const hi = cut.text.length - (cut.text.endsWith("…") ? 1 : 0);
  const inside = bodyTokens.map((t) => [t.start + cut.shift, t.end + cut.shift] as [number, number]).filter(([s, e]) => s >= lo && e <= hi);
  if (inside.length > 0) matches.push({ field: "body", value: cut.text, ranges: inside });
  return { matches, snippet: cut.text };
}

function sourceOf(kind: Alternative["kind"]): SearchVia["source"] {
  if (kind === "related") return "lexicon";
  return isWordNetKind(kind) ? "wordnet" : "thesaurus";
}

/**
 * Query words this document answers only through the thesaurus, with the term that matched:
 * "tracker" → "marker". A word that also matched directly (itself, its family, a correction) is not
 * listed.
 */
export function thesaurusMatches(plan: QueryPlan, has: (stemId: number, inShortFields: boolean) => boolean, query: string): SearchVia[] {
  const out: SearchVia[] = [];
  const direct = (kind: Alternative["kind"]): boolean => !isThesaurusKind(kind);
  // Thesaurus phrases count in the short fields only, as scoring.ts counts them.
  const found = (a: Alternative): boolean => a.stems.every((s) => has(s, !direct(a.kind) && a.stems.length > 1));
  plan.units.forEach((u) => {
    if (u.alternatives.some((a) => direct(a.kind) && found(a))) return;
    const via = u.alternatives.find((a) => !direct(a.kind) && found(a));
    if (via) out.push({ word: query.slice(u.start, u.end), term: via.surface, kind: via.kind === "synonym" || via.kind === "wordnet" ? "synonym" : "broader", source: sourceOf(via.kind) });
  });
  for (const s of plan.spans) {
    const units = plan.units.slice(s.first, s.first + s.count);
    if (units.every((u) => u.alternatives.some((a) => direct(a.kind) && found(a)))) continue;
    const via = s.alternatives.find((a) => !direct(a.kind) && found(a));
    const first = units[0];
    const last = units[units.length - 1];
    if (via && first && last) out.push({ word: query.slice(first.start, last.end), term: via.surface, kind: via.kind === "synonym" ? "synonym" : "broader", source: sourceOf(via.kind) });
  }
  return out;
}
