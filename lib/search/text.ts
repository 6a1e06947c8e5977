/**
 * Text helpers for search: tokenising with offsets, a light stemmer, stop words and edit distance.
 * Client-safe and pure, so the UI and tests can use them too.
 */

export type Token = {
  /** Lower-cased, accent-folded surface form. */
  word: string;
  start: number;
  /** Exclusive. */
  end: number;
};

// Small English list: only words that carry no meaning in a technique search. Trade words such as
// "plate", "screen" or "remove" are NOT here, because they distinguish techniques.
const STOP_WORDS = new Set(
  (
    "a an and are as at be but by can do does for from has have how i if in into is it its my of on or " +
    "so than that the their then there these this those to was we what when where which while who why " +
    "will with you your our me get got just any some all no not very too also out up"
  ).split(" "),
);

export function isStopWord(word: string): boolean {
  return STOP_WORDS.has(word);
}

function foldChar(ch: string): string {
  // NFD splits "é" into "e" + combining accent; keep the base letter so offsets stay one-to-one.
  const base = ch.normalize("NFD").charAt(0);
  return base.toLowerCase();
}

function isWordCode(c: number): boolean {
  return (c >= 97 && c <= 122) || (c >= 48 && c <= 57);
}

/**
 * Split text into word tokens ([a-z0-9] runs after lower-casing and accent folding) with their offsets
 * in the original string. `splitCamel` also breaks "blackPoint" into "black" + "point" (parameter names).
 * Single letters are dropped: they never identify a technique.
 */
export function tokenize(text: string, splitCamel = false): Token[] {
  // Fast path for plain ASCII text (nearly every body): one regex pass instead of a char loop.
  if (!splitCamel && ASCII_ONLY.test(text)) {
    const out: Token[] = [];
    WORD_RE.lastIndex = 0;
    for (let m = WORD_RE.exec(text); m !== null; m = WORD_RE.exec(text)) {
      const raw = m[0];
      if (raw.length === 1 && !(raw >= "0" && raw <= "9")) continue;
      out.push({ word: raw.toLowerCase(), start: m.index, end: m.index + raw.length });
    }
    return out;
  }
  return tokenizeSlow(text, splitCamel);
}

const ASCII_ONLY = /^[\x00-\x7f]*$/;
const WORD_RE = /[A-Za-z0-9]+/g;

function tokenizeSlow(text: string, splitCamel: boolean): Token[] {
  const out: Token[] = [];
  let word = "";
  let start = -1;
  let prevLower = false;
  const flush = (end: number): void => {
    if (start >= 0 && (word.length > 1 || (word.length === 1 && word >= "0" && word <= "9"))) {
      out.push({ word, start, end });
    }
    word = "";
    start = -1;
  };
  for (let i = 0; i < text.length; i++) {
    let code = text.charCodeAt(i);
    let ch: string;
    const isUpper = code >= 65 && code <= 90;
    if (isUpper) {
      code += 32;
      ch = String.fromCharCode(code);
    } else if (code < 128) {
      ch = text[i] as string;
    } else {
      ch = foldChar(text[i] as string);
      code = ch.length === 1 ? ch.charCodeAt(0) : 0;
    }
    if (isWordCode(code)) {
      if (splitCamel && isUpper && prevLower && start >= 0) flush(i);
      if (start < 0) start = i;
      word += ch;
      prevLower = code >= 97 && code <= 122 && !isUpper;
    } else {
      flush(i);
      prevLower = false;
    }
  }
  flush(text.length);
  return out;
}

function undouble(w: string): string {
  const n = w.length;
  if (n >= 3 && w[n - 1] === w[n - 2] && !"lsz".includes(w[n - 1] as string)) return w.slice(0, -1);
  return w;
}

/**
 * A light, conservative suffix stripper: plurals, -ing, -ed and a final -e, so that "markers"/"marker"
 * and "tracking"/"tracks" meet. It is not the Porter stemmer. "-er" is kept on purpose: "trackers"
 * (tracking markers) must not become "tracks" (footprints, tyre tracks).
 */
export function stem(word: string): string {
  let w = word;
  if (w.length <= 3 || /^[0-9]/.test(w)) return w;
  if (w.endsWith("ies") && w.length > 4) w = w.slice(0, -3) + "y";
  else if (w.endsWith("sses")) w = w.slice(0, -2);
  else if (/(?:ches|shes|xes|zes)$/.test(w)) w = w.slice(0, -2);
  else if (w.endsWith("s") && !/(?:ss|us|is)$/.test(w) && w.length > 3) w = w.slice(0, -1);

  if (w.endsWith("ing") && w.length > 5) w = undouble(w.slice(0, -3));
  else if (w.endsWith("ed") && w.length > 4) w = undouble(w.slice(0, -2));

  if (w.endsWith("e") && w.length > 3) w = w.slice(0, -1);
  // Undouble once more so "matte", "mattes" and "matting" all meet at "mat".
  return undouble(w);
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
