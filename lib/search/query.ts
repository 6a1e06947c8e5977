/**
 * Query parsing: a typed query becomes units (one per content word, weighted by how much a word
 * like it says about a problem) and spans (several units that together spell a thesaurus term or a
 * run-together word). Each unit and span holds the alternatives a page may match it by — the word
 * itself, its word family, a completion of a partial last word, a spelling correction, a split
 * compound, thesaurus terms — each with its own weight (scoring.ts).
 */
import { ALTERNATIVE_WEIGHTS, completionWeight, isWordNetKind, MAX_UNITS } from "./scoring";
import { findPhrases, type CompiledThesaurus } from "./thesaurus";
import { FILLER_WEIGHT, GENERIC_WEIGHT, isAddressee, isStopWord, queryWordWeight, tokenize, type Token } from "./text";
import type { Vocabulary } from "./vocabulary";

export type AlternativeKind =
  | "exact"
  | "stem"
  | "family"
  | "parts"
  | "prefix"
  | "typo"
  | "split"
  | "joined"
  | "synonym"
  | "broader"
  | "related"
  | "wordnet"
  | "wordnetBroader";

/**
 * One way a page can answer a unit or span: all `stems` present (one stem for most kinds).
 * `exactWords`: for a quoted thesaurus term, the page words highlighting may mark (per stem).
 */
export type Alternative = { stems: number[]; weight: number; kind: AlternativeKind; surface: string; exactWords?: string[] };

export type QueryUnit = {
  text: string;
  start: number;
  end: number;
  weight: number;
  alternatives: Alternative[];
  correction?: string;
  /**
   * Corrections as near to what was typed as `correction`, in the same order of preference: the one
   * that shares a page with the query's other words is taken instead ("kite strng" → string, not strong).
   */
  correctionChoices?: string[];
  /**
   * A filler word ("get", "out", "way"): not looked up on its own — it is on most pages and would
   * only cost time — but it still spells thesaurus phrases ("get rid of", "put grain back").
   */
  isFiller?: boolean;
};
export type QuerySpan = { first: number; count: number; alternatives: Alternative[] };
export type QueryPlan = { units: QueryUnit[]; spans: QuerySpan[] };

export type ParseOptions = {
  /** Complete partial words: the last one while typing a search, every one in the quick finder. */
  prefix: "last" | "all" | "none";
  /** "Search for exactly what I typed": no spelling corrections. */
  exact: boolean;
};

export type QueryContext = {
  vocab: Vocabulary;
  thesaurus: CompiledThesaurus;
  docFreq: (stemId: number) => number;
  /** Whether some document contains both stems; without it corrections ignore the other words. */
  shareADocument?: (a: number, b: number) => boolean;
};

const MAX_ALTERNATIVES = 8;

export function parseQuery(query: string, ctx: QueryContext, options: ParseOptions): QueryPlan {
  const raw = tokenize(query);
  const content = raw.filter((t, i) => !isStopWord(t.word) && !isAddressee(raw, i));
  const tokens = (content.length > 0 ? content : raw).slice(0, MAX_UNITS);
  // A query of filler words only ("take out") is looked up word by word after all.
  const onlyFiller = tokens.every((t) => queryWordWeight(t.word) <= FILLER_WEIGHT);
  const units = tokens.map((tok, i) => parseWord(tok, ctx, options.prefix === "all" || (options.prefix === "last" && i === tokens.length - 1), options.exact, onlyFiller));
  chooseCorrectionsByContext(units, ctx);
  const spans: QuerySpan[] = [];
  const taken = new Uint8Array(units.length);

  // Thesaurus terms, longest first: each unit may stand for its own stem or its correction. Worked out
  // once per unit: the phrase finder asks for a unit's stems again for every rule that starts near it.
  const unitStems = units.map((u, i) => {
    const out = [ctx.vocab.stemOf((tokens[i] as Token).word)];
    // Irregular and kept inflections meet the thesaurus by their base too ("men" as man, as "markers" does as marker).
    for (const b of ctx.vocab.baseForms((tokens[i] as Token).word)) out.push(ctx.vocab.stemOf(b));
    if (u.correction) out.push(ctx.vocab.stemOf(u.correction));
    for (const a of u.alternatives) if ((a.kind === "typo" || a.kind === "exact" || a.kind === "stem") && a.stems.length === 1) out.push(ctx.vocab.stemWords[a.stems[0] as number] as string);
    return out;
  });
  const stemsAt = (i: number): string[] => unitStems[i] as string[];
  const wordsAt = (i: number): string[] => {
    const u = units[i] as QueryUnit;
    return u.correction ? [(tokens[i] as Token).word, u.correction] : [(tokens[i] as Token).word];
  };
  for (const match of findPhrases(units.length, stemsAt, ctx.thesaurus, wordsAt)) {
    const targets: Alternative[] = [];
    for (const t of match.rule.targets) {
      const stems = t.stems.map((s) => ctx.vocab.stemIdOf(s));
      if (stems.some((s) => s === undefined || ctx.docFreq(s) === 0)) continue;
      const alt: Alternative = { stems: stems as number[], weight: ALTERNATIVE_WEIGHTS[t.kind], kind: t.kind, surface: t.text };
      if (t.exact) alt.exactWords = t.exact;
      targets.push(alt);
    }
    if (targets.length === 0) continue;
    // The leads' thesaurus decides what its words mean: WordNet's guesses for them are dropped.
    for (let k = match.first; k < match.first + match.count; k++) {
      const u = units[k] as QueryUnit;
      u.alternatives = u.alternatives.filter((a) => !isWordNetKind(a.kind));
    }
    if (match.count === 1) (units[match.first] as QueryUnit).alternatives.push(...targets);
    else spans.push({ first: match.first, count: match.count, alternatives: targets });
    for (let k = match.first; k < match.first + match.count; k++) taken[k] = 1;
  }

  // Two typed words that the pages write as one ("foot prints" → footprints, "fall off" → falloff).
  for (let i = 0; i + 1 < units.length; i++) {
    if (taken[i] || taken[i + 1]) continue;
    const a = tokens[i] as Token;
    const b = tokens[i + 1] as Token;
    if (b.start - a.end > 1) continue;
    const joined = ctx.vocab.stemIdOf(ctx.vocab.stemOf(a.word + b.word));
    if (joined === undefined || ctx.docFreq(joined) === 0) continue;
    spans.push({ first: i, count: 2, alternatives: [{ stems: [joined], weight: ALTERNATIVE_WEIGHTS.joined, kind: "joined", surface: a.word + b.word }] });
    taken[i] = taken[i + 1] = 1;
  }
  return { units, spans };
}

function parseWord(tok: Token, ctx: QueryContext, allowPrefix: boolean, exact: boolean, lookUpFiller: boolean): QueryUnit {
  if (!lookUpFiller && queryWordWeight(tok.word) <= FILLER_WEIGHT) return { text: tok.word, start: tok.start, end: tok.end, weight: queryWordWeight(tok.word), alternatives: [], isFiller: true };
  const { vocab } = ctx;
  const word = tok.word;
  const out: Alternative[] = [];
  const live = (stemId: number | undefined): stemId is number => stemId !== undefined && ctx.docFreq(stemId) > 0;
  const stem = vocab.stemOf(word);
  const stemId = vocab.stemIdOf(stem);
  const isKnown = vocab.isKnownWord(word);
  const isNumeric = /^[0-9]/.test(word);
  // Meeting a page word only through the stemmer ("trakers" → "traker") is weaker evidence than
  // the word itself, so corrections compete with it.
  if (live(stemId)) out.push({ stems: [stemId], weight: isKnown ? ALTERNATIVE_WEIGHTS.exact : ALTERNATIVE_WEIGHTS.stem, kind: isKnown ? "exact" : "stem", surface: word });
  if (tok.parts && tok.parts.length > 0) {
    const parts = tok.parts.filter((p) => !isStopWord(p.word)).map((p) => vocab.stemIdOf(vocab.stemOf(p.word)));
    if (parts.length > 0 && parts.every(live)) out.push({ stems: parts, weight: ALTERNATIVE_WEIGHTS.parts, kind: "parts", surface: tok.parts.map((p) => p.word).join(" ") });
  }
  if (!isNumeric) {
    for (const f of vocab.family(stem)) if (live(f)) out.push({ stems: [f], weight: ALTERNATIVE_WEIGHTS.family, kind: "family", surface: vocab.stemWords[f] as string });
    // The dictionary form where the stemmer keeps an inflection ("brighter" → bright, "darker" → dark).
    for (const base of vocab.baseForms(word)) {
      const sid = vocab.stemIdOf(vocab.stemOf(base));
      if (sid !== stemId && live(sid)) out.push({ stems: [sid], weight: ALTERNATIVE_WEIGHTS.family, kind: "family", surface: base });
    }
  }
  if (isNumeric) return unit(tok, out);

  const hasExact = out.length > 0;
  if (word.length >= 3 && (allowPrefix || !hasExact)) {
    for (const sf of vocab.completions(word)) {
      const w = vocab.surfaceWords[sf] as string;
      out.push({ stems: [vocab.surfaceStem[sf] as number], weight: completionWeight(word, w, hasExact), kind: "prefix", surface: w });
    }
  }
  // Spelling: a word the pages or the thesaurus use, or any English word, is never changed.
  let correction: string | undefined;
  const correctionChoices: string[] = [];
  // A run-together word whose halves are words ("infront", "deadpixel") is read as those words first.
  const isSplit = !hasExact && !isKnown && word.length >= 5 && !vocab.passesSpellCheck(word) && splitCompound(word, ctx, out);
  if (!exact && !isKnown && !isSplit && !vocab.passesSpellCheck(word)) {
    const maxDistance = word.length <= 3 ? 0 : word.length <= 5 ? 1 : 2;
    const found = vocab.corrections(word, maxDistance);
    // Prefer the word closest to what was typed ("markrs" → "markers", not "mark", though their stems
    // are equally near), then the exact word on most pages (the word the person most likely meant:
    // "markers" over "marks", both one edit away), then the one written most often (a corrector's
    // usual prior: among equally near words, the commoner in the text), then the family on most pages.
    const stemDocs = (c: (typeof found)[number]) => ctx.docFreq(vocab.surfaceStem[c.surfaceId] as number);
    found.sort(
      (a, b) =>
        a.surfaceDistance - b.surfaceDistance ||
        vocab.surfaceUses(b.surfaceId) - vocab.surfaceUses(a.surfaceId) ||
        vocab.surfaceOccurrences(b.surfaceId) - vocab.surfaceOccurrences(a.surfaceId) ||
        stemDocs(b) - stemDocs(a),
    );
    for (const c of found) {
      const w = vocab.surfaceWords[c.surfaceId] as string;
      const sid = vocab.surfaceStem[c.surfaceId] as number;
      // A thesaurus-only word has no pages but still counts as the correction (the thesaurus maps it).
      correction ??= w;
      if (c.surfaceDistance === found[0]?.surfaceDistance && live(sid)) correctionChoices.push(w);
      if (live(sid)) out.push({ stems: [sid], weight: c.distance === 1 ? ALTERNATIVE_WEIGHTS.typo : ALTERNATIVE_WEIGHTS.typo2, kind: "typo", surface: w });
    }
  } else if (!exact && !isKnown && !hasExact && !isSplit && word.length >= 4) {
    // A real word that no page uses ("flor", "lite"): it stays as typed — no banner claims otherwise —
    // but page words one edit away count a little, since it is often a slip for one of them.
    for (const c of vocab.corrections(word, 1)) {
      const sid = vocab.surfaceStem[c.surfaceId] as number;
      if (live(sid)) out.push({ stems: [sid], weight: ALTERNATIVE_WEIGHTS.nearWord, kind: "typo", surface: vocab.surfaceWords[c.surfaceId] as string });
    }
  }
  // Only for real words the pages never use (nor their family), and not for misspellings: where pages
  // say the word, or the word is a slip for a page word, their own vocabulary answers it better.
  if (!hasExact && !isSplit && (isKnown || vocab.isEnglishWord(word))) addWordNet(word, stem, ctx, out);
  // A word that mostly says where or how ("behind", "through", "away") weighs like a generic action word.
  const weight = vocab.isMostlyAdverb(word) ? Math.min(GENERIC_WEIGHT, queryWordWeight(word)) : undefined;
  const u = unit(tok, out, hasExact ? undefined : correction, weight);
  if (u.correction && correctionChoices.length > 1) u.correctionChoices = correctionChoices;
  return u;
}

/**
 * Where a misspelt word has several equally near corrections, take the one found on a page with most
 * of the query's other words: the words around a typo say which word was meant. Only the correction
 * shown (and searched by meaning) changes: every candidate stays an alternative of the word.
 */
function chooseCorrectionsByContext(units: QueryUnit[], ctx: QueryContext): void {
  const share = ctx.shareADocument;
  if (!share || units.length < 2) return;
  const stemId = (word: string) => ctx.vocab.stemIdOf(ctx.vocab.stemOf(word));
  // What the other words certainly mean: themselves (or their stem), or their own correction.
  const meant = units.map((u) => {
    const own = u.alternatives.filter((a) => (a.kind === "exact" || a.kind === "stem") && a.stems.length === 1).map((a) => a.stems[0] as number);
    const corrected = u.correction === undefined ? undefined : stemId(u.correction);
    return corrected === undefined ? own : [...own, corrected];
  });
  units.forEach((u, i) => {
    if (!u.correctionChoices || u.correctionChoices.length < 2) return;
    let best = u.correction;
    let bestCount = -1;
    for (const choice of u.correctionChoices) {
      const sid = stemId(choice);
      if (sid === undefined) continue;
      const count = meant.filter((stems, j) => j !== i && stems.some((s) => share(sid, s))).length;
      if (count > bestCount) {
        best = choice;
        bestCount = count;
      }
    }
    if (best !== undefined) u.correction = best;
  });
}

/**
 * Everyday words related to the word (WordNet, wordnet.ts) that pages use: "tourists" → person,
 * "mattress" → pad. The loosest kind of match, under every other (scoring.ts).
 */
function addWordNet(word: string | undefined, ownStem: string, ctx: QueryContext, out: Alternative[]): void {
  if (!word || word.length < 3) return;
  const have = new Set(out.flatMap((a) => a.stems));
  for (const link of ctx.vocab.relatedWords(word)) {
    const stem = ctx.vocab.stemOf(link.word);
    if (stem === ownStem) continue;
    const sid = ctx.vocab.stemIdOf(stem);
    if (sid === undefined || have.has(sid) || ctx.docFreq(sid) === 0) continue;
    have.add(sid);
    const kind = link.kind === "synonym" ? "wordnet" : "wordnetBroader";
    const weight = link.steps === 2 ? ALTERNATIVE_WEIGHTS.wordnetBroader2 : ALTERNATIVE_WEIGHTS[kind];
    out.push({ stems: [sid], weight, kind, surface: link.word });
  }
}

/** A run-together word that is not itself a word ("infront", "deadpixel"): split where both halves are. */
function splitCompound(word: string, ctx: QueryContext, out: Alternative[]): boolean {
  const { vocab } = ctx;
  const known = (w: string): boolean => w.length >= 2 && (vocab.isKnownWord(w) || vocab.isEnglishWord(w));
  for (let k = 2; k <= word.length - 2; k++) {
    const a = word.slice(0, k);
    const b = word.slice(k);
    if (!known(a) || !known(b)) continue;
    const stems = [a, b]
      .filter((w) => !isStopWord(w))
      .map((w) => vocab.stemIdOf(vocab.stemOf(w)))
      .filter((s): s is number => s !== undefined && ctx.docFreq(s) > 0);
    if (stems.length === 0) continue;
    out.push({ stems, weight: ALTERNATIVE_WEIGHTS.split, kind: "split", surface: `${a} ${b}` });
    return true;
  }
  return false;
}

function unit(tok: Token, alternatives: Alternative[], correction?: string, weightOverride?: number): QueryUnit {
  const weight = weightOverride ?? queryWordWeight(tok.word);
  // One alternative per stem set (the strongest), then the strongest few: more only adds noise and time.
  const best = new Map<string, Alternative>();
  for (const a of alternatives) {
    const key = a.stems.join(",");
    const prev = best.get(key);
    if (!prev || a.weight > prev.weight) best.set(key, a);
  }
  const kept = [...best.values()].sort((a, b) => b.weight - a.weight).slice(0, MAX_ALTERNATIVES);
  return { text: tok.word, start: tok.start, end: tok.end, weight, alternatives: kept, ...(correction ? { correction } : {}) };
}
