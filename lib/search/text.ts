/**
 * Text helpers for search: tokenising with offsets, the stop-word list, how much a query word
 * weighs, edit distance and trigrams. Client-safe and pure, so the UI and tests can use them too
 * (stemming lives in stemming.ts, which the browser never needs).
 */

export type Token = {
  /** Lower-cased, accent-folded surface form; a hyphenated compound without its hyphens ("cstand"). */
  word: string;
  start: number;
  /** Exclusive. */
  end: number;
  /** The pieces of a hyphenated compound ("c-stand" → stand; "16-bit" → 16, bit), single letters left out. */
  parts?: Token[];
};

// The one stop-word list (issue 14): words that never describe a plate problem, dropped from queries
// and documents alike. Trade words ("plate", "screen", "remove") are NOT here, and neither are the
// little words trade phrases are made of ("take out", "put grain back", "fall off"): those are
// filler words below, kept at a small weight so thesaurus phrases can still match them.
const STOP_WORDS = new Set(
  (
    "a an and are as at be but by can could do does did for from has have had how i if in into is it its my of on or " +
    "so than that the their them then there these they this those to was we were what when where which while who why " +
    "will would with you your our me am just any all no not very too also " +
    // Pronouns and function words of Snowball's English stop list (from memory) that a plate
    // description also uses ("our own shadows", "her face", "because it flickers").
    "he him his himself she her hers herself itself theirs themselves myself ours ourselves yours yourself yourselves " +
    "whom been being having ought because until again further both nor own such " +
    // Contractions, typed with or without the apostrophe.
    "dont doesnt didnt isnt arent wasnt cant couldnt wont wouldnt shouldnt im ive whats theres thats"
  ).split(" "),
);

export function isStopWord(word: string): boolean {
  return STOP_WORDS.has(word);
}

// "can someone tell me…", "does anybody know…": a question put to colleagues, not a person in the plate.
const ASKING_AUXILIARIES = new Set("can could would will do does did has have may might".split(" "));
const ADDRESSEES = new Set("someone somebody anyone anybody everyone everybody".split(" "));

/** Whether `tokens[i]` is whom a question is put to ("can someone …"), a word to leave out like a stop word. */
export function isAddressee(tokens: readonly Token[], i: number): boolean {
  return i > 0 && ADDRESSEES.has((tokens[i] as Token).word) && ASKING_AUXILIARIES.has((tokens[i - 1] as Token).word);
}

// Words that carry no problem: asking ("need", "help", "best way"), doing in general ("get", "take",
// "make", "deal") and the particles of phrasal verbs. They stay in the query at a small weight, so a
// question full of them is judged by its few content words.
const FILLER_WORDS = new Set(
  (
    "need needs needed help want wanted wants trying try tried way ways best good better easiest easy quick quickly " +
    "get gets getting got rid take takes taking took make makes making made do doing done deal dealing " +
    "thing things stuff bit bits lot lots kind sort really please anyone tell know able should " +
    "out up off back down over around away about here some put go going use using" +
    // The same verbs' other forms: a filler word is filler in any inflection ("goes", "used", "tried").
    " needing wanting helps helped helping tries puts putting goes went gone uses used deals dealt tells told telling knows knew known knowing"
  ).split(" "),
);

// Generic action words: most write-ups remove or fix something, so these say little about which one.
const GENERIC_WORDS = new Set(
  "remove removes removal removals removing removed fix fixes fixing fixed clean cleans cleaned cleaning cleanup repair repairs repairing repaired".split(" "),
);

// Prepositions that say where or when, not what: WordNet has no adverb sense for them, so the rule for
// "behind" and "through" (query.ts) misses them, yet "wires against the sky" is about wires and sky.
// Standard English stop lists drop such words (Snowball's has "against" and "during", from memory);
// here they keep the generic weight, as "behind" does.
const PLACE_WORDS = new Set("against beside toward towards onto upon among amongst amid via during despite".split(" "));

/** A preposition of place or time that WordNet has no adverb sense for; negation's reach ends there too. */
export function isPlaceWord(word: string): boolean {
  return PLACE_WORDS.has(word);
}

export const FILLER_WEIGHT = 0.15;
export const GENERIC_WEIGHT = 0.5;

/** How much a query word counts toward a page's score (1 for words that name a problem or a plate). */
export function queryWordWeight(word: string): number {
  if (FILLER_WORDS.has(word)) return FILLER_WEIGHT;
  if (GENERIC_WORDS.has(word) || PLACE_WORDS.has(word)) return GENERIC_WEIGHT;
  return 1;
}

function foldChar(ch: string): string {
  // NFD splits "é" into "e" + combining accent; keep the base letter so offsets stay one-to-one.
  const base = ch.normalize("NFD").charAt(0);
  return base.toLowerCase();
}

function isWordCode(c: number): boolean {
  return (c >= 97 && c <= 122) || (c >= 48 && c <= 57);
}

const isDigits = (w: string): boolean => w.charCodeAt(0) >= 48 && w.charCodeAt(0) <= 57;
/** Single letters never identify a technique; single digits can ("3 x 3"). */
const keeps = (w: string): boolean => w.length > 1 || isDigits(w);

/**
 * Split text into word tokens with their offsets in the original string: [a-z0-9] runs after
 * lower-casing and accent folding; an apostrophe inside a word is dropped ("don't" → "dont"); runs
 * joined by single hyphens become one compound token that keeps its parts ("c-stand", "16-bit").
 * `splitCamel` also breaks "blackPoint" into "black" + "point" (parameter names).
 */
export function tokenize(text: string, splitCamel = false): Token[] {
  const runs = wordRuns(text, splitCamel);
  const out: Token[] = [];
  for (let i = 0; i < runs.length; i++) {
    let j = i;
    // A hyphen with word characters right on both sides joins the runs into a compound.
    while (j + 1 < runs.length && (runs[j + 1] as Token).start === (runs[j] as Token).end + 1 && text.charCodeAt((runs[j] as Token).end) === 45) j++;
    if (j === i) {
      const t = runs[i] as Token;
      if (keeps(t.word)) out.push(t);
      continue;
    }
    const pieces = runs.slice(i, j + 1);
    const first = pieces[0] as Token;
    const last = pieces[pieces.length - 1] as Token;
    out.push({ word: pieces.map((p) => p.word).join(""), start: first.start, end: last.end, parts: pieces.filter((p) => keeps(p.word)) });
    i = j;
  }
  return out;
}

/** The plain [a-z0-9] runs (apostrophes inside words folded away), before hyphen compounds are joined. */
function wordRuns(text: string, splitCamel: boolean): Token[] {
  // Fast path for plain ASCII text without apostrophes (nearly every body): one regex pass.
  if (!splitCamel && ASCII_PLAIN.test(text)) {
    const out: Token[] = [];
    WORD_RE.lastIndex = 0;
    for (let m = WORD_RE.exec(text); m !== null; m = WORD_RE.exec(text)) out.push({ word: m[0].toLowerCase(), start: m.index, end: m.index + m[0].length });
    return out;
  }
  return wordRunsSlow(text, splitCamel);
}

const ASCII_PLAIN = /^[^\x80-\uffff']*$/;
const WORD_RE = /[A-Za-z0-9]+/g;
const APOSTROPHES = new Set(["'", "\u2019"]);

function wordRunsSlow(text: string, splitCamel: boolean): Token[] {
  const out: Token[] = [];
  let word = "";
  let start = -1;
  let prevLower = false;
  const flush = (end: number): void => {
    if (start >= 0 && word.length > 0) out.push({ word, start, end });
    word = "";
    start = -1;
  };
  for (let i = 0; i < text.length; i++) {
    const raw = text[i] as string;
    let code = text.charCodeAt(i);
    let ch: string;
    const isUpper = code >= 65 && code <= 90;
    if (isUpper) {
      code += 32;
      ch = String.fromCharCode(code);
    } else if (code < 128) {
      ch = raw;
    } else {
      ch = foldChar(raw);
      code = ch.length === 1 ? ch.charCodeAt(0) : 0;
    }
    if (isWordCode(code)) {
      if (splitCamel && isUpper && prevLower && start >= 0) flush(i);
      if (start < 0) start = i;
      word += ch;
      prevLower = code >= 97 && code <= 122 && !isUpper;
    } else if (APOSTROPHES.has(raw) && start >= 0 && isWordCode((text[i + 1] ?? " ").toLowerCase().charCodeAt(0))) {
      // A possessive "'s" ("actress's", "someone's") is no part of the word: left out, inside its range.
      if ((text[i + 1] === "s" || text[i + 1] === "S") && !isWordCode((text[i + 2] ?? " ").toLowerCase().charCodeAt(0))) {
        i++;
        continue;
      }
      // "don't": one word, the apostrophe left out of it but inside its range.
      continue;
    } else {
      flush(i);
      prevLower = false;
    }
  }
  flush(text.length);
  return out;
}

/**
 * Optimal string alignment distance (Levenshtein plus adjacent transpositions, each substring edited
 * once), stopping early once it must exceed `max`. Returns max + 1 in that case.
 */
export function editDistance(a: string, b: string, max = Number.POSITIVE_INFINITY): number {
  const la = a.length;
  const lb = b.length;
  if (Math.abs(la - lb) > max) return max + 1;
  if (la === 0) return lb;
  if (lb === 0) return la;
  let prev2 = new Array<number>(lb + 1).fill(0);
  let prev = new Array<number>(lb + 1);
  let cur = new Array<number>(lb + 1);
  for (let j = 0; j <= lb; j++) prev[j] = j;
  for (let i = 1; i <= la; i++) {
    cur[0] = i;
    let rowMin = i;
    const ca = a.charCodeAt(i - 1);
    for (let j = 1; j <= lb; j++) {
      const cb = b.charCodeAt(j - 1);
      const cost = ca === cb ? 0 : 1;
      let v = Math.min((prev[j] as number) + 1, (cur[j - 1] as number) + 1, (prev[j - 1] as number) + cost);
      if (i > 1 && j > 1 && ca === b.charCodeAt(j - 2) && a.charCodeAt(i - 2) === cb) {
        v = Math.min(v, (prev2[j - 2] as number) + 1);
      }
      cur[j] = v;
      if (v < rowMin) rowMin = v;
    }
    if (rowMin > max) return max + 1;
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[lb] as number;
}

/** Padded character trigrams of a word ("ab" → " ab", "ab "), the keys of the vocabulary index. */
export function trigrams(word: string): string[] {
  const padded = ` ${word} `;
  const out: string[] = [];
  for (let i = 0; i + 3 <= padded.length; i++) out.push(padded.slice(i, i + 3));
  return out;
}
