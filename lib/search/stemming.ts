/**
 * Stems for search: the English Snowball stemmer (Porter2, via wink-porter2-stemmer) with two small
 * additions of our own, and the word families that join derived forms ("dark" → "darken",
 * "blurry" → "blur") at a lower weight than the stem itself.
 */
import porter2 from "wink-porter2-stemmer";

function undouble(s: string): string {
  const n = s.length;
  // Porter2 undoubles after "-ing" ("vignetting" → "vignet") but not otherwise ("vignette" → "vignett").
  if (n >= 4 && s[n - 1] === s[n - 2] && !"lsz".includes(s[n - 1] as string)) return s.slice(0, -1);
  return s;
}

/**
 * The stem of one lower-case token. Tokens with a digit are kept whole ("3x3", "2k", "16bit", shot
 * codes): stemming "2ks" or "040s" would only merge things that differ.
 */
export function snowballStem(word: string): string {
  if (word.length <= 2 || /[0-9]/.test(word)) return word;
  return porter2(word);
}

// Derivational endings that do not change which problem a word names ("darken", "blurry", "shiny",
// "greenish", "darkly"). "-er" is not among them on purpose: "trackers" (tracking markers) are not
// "tracks" (footprints, tyre tracks), and Porter2 keeps the two apart.
const FAMILY_ENDINGS = ["en", "i", "li", "ish", "al", "ial"] as const;
// Prefixes of the trade that undo or take away what the rest names: "deflicker", "despill",
// "degrain", "undistort". The rest must be a stem of its own of at least four letters.
const FAMILY_PREFIXES = ["de", "un"] as const;

/**
 * Stems that may belong to the same word family as `stem`: shorter ones with a derivational ending
 * taken off, and longer ones with one put on. The caller keeps only those its vocabulary has.
 */
export function familyCandidates(stem: string): string[] {
  if (stem.length < 3 || /[0-9]/.test(stem)) return [];
  const out = new Set<string>();
  for (const end of FAMILY_ENDINGS) {
    if (stem.length - end.length >= 3 && stem.endsWith(end)) {
      const base = stem.slice(0, -end.length);
      out.add(base);
      out.add(undouble(base));
      out.add(`${base}e`);
    }
    out.add(stem + end);
    // "blur" → "blurri" (blurry), "shine" → "shini" (shiny).
    out.add(stem + stem.slice(-1) + end);
    if (stem.endsWith("e")) out.add(stem.slice(0, -1) + end);
  }
  // "vignett" (vignette) ↔ "vignet" (vignetting).
  out.add(undouble(stem));
  if (!/[aeiou]$/.test(stem)) out.add(stem + stem.slice(-1));
  for (const pre of FAMILY_PREFIXES) {
    // Porter2 takes "-er" and a final "l" of "ll" off the longer word only ("deflickering" →
    // "deflick" while "flicker" stays; "despill" → "despil" while "spill" stays).
    if (stem.startsWith(pre) && stem.length - pre.length >= 4) {
      const rest = stem.slice(pre.length);
      out.add(rest);
      out.add(`${rest}er`);
      if (rest.endsWith("l")) out.add(`${rest}l`);
    }
    if (stem.length >= 4) {
      out.add(pre + stem);
      if (stem.endsWith("er")) out.add(pre + stem.slice(0, -2));
      if (stem.endsWith("ll")) out.add(pre + stem.slice(0, -1));
    }
  }
  out.delete(stem);
  return [...out];
}
