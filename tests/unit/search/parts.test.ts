import { describe, expect, it } from "vitest";

import { createLanguage } from "@/lib/search/language";
import { DocumentAnalyser, FIELD_COUNT, PostingStore, Postings } from "@/lib/search/postings";
import { parseQuery, type QueryContext } from "@/lib/search/query";
import { aboveFloor, bestScore, gradedScore, problemTagsHit, promoteHouseMethods, RANKING, rankKey, type RankItem } from "@/lib/search/ranking";
import { ALTERNATIVE_WEIGHTS, bm25Idf, Scorer } from "@/lib/search/scoring";
import { matchesFor, thesaurusMatches } from "@/lib/search/snippets";
import { compileThesaurus, findPhrases, type ThesaurusEntry } from "@/lib/search/thesaurus";
import { Vocabulary } from "@/lib/search/vocabulary";
import type { SearchDocument } from "@/lib/search/types";
import { searchDoc } from "@/tests/unit/search/search-doc";

// Each part of the engine on its own, with a tiny word list. Behaviour is Plateroom's own (issue 16)
// unless a source is named.
const language = createLanguage(["flor", "seems", "sideways", "side", "ways", "in", "front", "someone"], [["colour", "color"]]);

const doc = searchDoc;

/** A small index built from the parts, as engine.ts does. */
function build(docs: SearchDocument[], thesaurus: ThesaurusEntry[] = []) {
  const vocab = new Vocabulary(language);
  const store = new PostingStore();
  vocab.onNewStem = () => store.addStem();
  const analyser = new DocumentAnalyser(vocab);
  docs.forEach((d, id) => {
    const a = analyser.analyse(d);
    store.add(id, a);
    for (const s of a.surfaces) vocab.addRef(s, 1);
  });
  const compiled = compileThesaurus(thesaurus, (w) => vocab.stemOf(w));
  for (const w of compiled.words) vocab.addRef(vocab.internSurface(w), 1);
  const ctx: QueryContext = { vocab, thesaurus: compiled, docFreq: (s) => store.docFreq(s) };
  return { vocab, store, ctx, scorer: new Scorer(store) };
}

describe("vocabulary", () => {
  const { vocab } = build([doc({ title: "Flattening the colour of a green screen", bodyText: "face tracking dots" })]);

  it("corrects against page words, comparing stems too (flaten → flattening)", () => {
    const words = (w: string, d: number) => vocab.corrections(w, d).map((c) => vocab.surfaceWords[c.surfaceId]);
    expect(words("flaten", 2)).toContain("flattening");
    expect(words("screan", 1)).toEqual(["screen"]);
  });

  it("finds a transposition in a short word that shares no trigram (fcae → face)", () => {
    expect(vocab.corrections("fcae", 1).map((c) => vocab.surfaceWords[c.surfaceId])).toEqual(["face"]);
  });

  it("completes partial words and relates word families", () => {
    expect(vocab.completions("flat").map((id) => vocab.surfaceWords[id])).toEqual(["flattening"]);
    expect(vocab.stemOf("color")).toBe(vocab.stemOf("colour"));
  });
});

describe("postings", () => {
  it("packs per-field counts and removes by id", () => {
    const p = new Postings();
    p.push(1, 0x11);
    p.push(4, 0x2);
    p.push(9, 0x100);
    p.remove(4);
    expect(Array.from(p.data.slice(0, p.n * 2))).toEqual([1, 0x11, 9, 0x100]);
  });

  it("indexes compounds whole and in parts, and run-together pairs in titles only", () => {
    const { vocab, store } = build([doc({ title: "Blue screen c-stand", bodyText: "blue screen" })]);
    const df = (w: string) => store.docFreq(vocab.stemIdOf(vocab.stemOf(w)) ?? -1);
    expect(df("cstand")).toBe(1);
    expect(df("stand")).toBe(1);
    expect(df("bluescreen")).toBe(1);
    // The title and the body count separately: "blue" is in field 0 (title) and field 6 (body).
    const list = store.lists[vocab.stemIdOf(vocab.stemOf("blue")) as number] as Postings;
    expect(list.data[1]).toBe(1 | (1 << (6 * 4)));
    expect(store.lengths.length).toBeGreaterThanOrEqual(FIELD_COUNT);
  });
});

describe("thesaurus", () => {
  const stemOf = (w: string) => w.replace(/s$/, "");
  const t = compileThesaurus(
    [
      { kind: "synonyms", terms: ["regrain", "grain restore", "put grain back"] },
      { kind: "narrower", broader: "marker", terms: ["tracker", "tape cross"] },
    ],
    stemOf,
  );

  it("makes synonyms mean each other and narrower terms reach their broader one only", () => {
    expect(t.rulesByFirstStem.get("regrain")?.[0]?.targets.map((x) => x.text)).toEqual(["grain restore", "put grain back"]);
    expect(t.rulesByFirstStem.get("tracker")?.[0]?.targets).toEqual([{ stems: ["marker"], text: "marker", kind: "broader" }]);
    expect(t.rulesByFirstStem.get("marker")).toBeUndefined();
  });

  it("adds the symptom lexicon one way and under the leads' entries", () => {
    const withLexicon = compileThesaurus(
      [{ kind: "synonyms", terms: ["patchy", "blotchy"] }],
      stemOf,
      [{ means: ["uneven", "patchy"], seen: ["blotchy", "mottled"] }],
    );
    expect(withLexicon.rulesByFirstStem.get("mottled")?.[0]?.targets.map((x) => [x.text, x.kind])).toEqual([
      ["uneven", "related"],
      ["patchy", "related"],
    ]);
    // The lead's synonym link stands; the lexicon only adds what the leads did not say.
    expect(withLexicon.rulesByFirstStem.get("blotchy")?.[0]?.targets.map((x) => [x.text, x.kind])).toEqual([
      ["patchy", "synonym"],
      ["uneven", "related"],
    ]);
    expect(withLexicon.rulesByFirstStem.get("uneven")).toBeUndefined();
  });

  it("meets a quoted term only with its words as written or their plurals, though the stems agree", () => {
    // A Snowball-like stemmer for this test: "backing" and "back" share the stem "back".
    const ingStem = (w: string) => w.replace(/s$/, "").replace(/ing$/, "");
    const quoted = compileThesaurus([{ kind: "narrower", broader: "screen", terms: ['"backing"', "backdrop"] }], ingStem);
    const loose = compileThesaurus([{ kind: "narrower", broader: "screen", terms: ["backing", "backdrop"] }], ingStem);
    const meets = (th: typeof quoted, word: string) => findPhrases(1, () => [ingStem(word)], th, () => [word]).map((f) => f.rule.text);
    expect(meets(loose, "back")).toEqual(["backing"]);
    expect(meets(quoted, "back")).toEqual([]);
    expect(meets(quoted, "backing")).toEqual(["backing"]);
    expect(meets(quoted, "backings")).toEqual(["backing"]);
    // The words inside the quotes still join spelling's vocabulary, without the quotes.
    expect(quoted.words.has("backing")).toBe(true);
    expect([...quoted.words].some((w) => w.includes('"'))).toBe(false);
  });

  it("finds the longest phrase a query spells, left to right without overlap", () => {
    const q = ["put", "grain", "back", "tape", "cros"];
    const found = findPhrases(q.length, (i) => [q[i] as string], t);
    expect(found.map((f) => [f.first, f.count, f.rule.text])).toEqual([
      [0, 3, "put grain back"],
      [3, 2, "tape cross"],
    ]);
  });
});

describe("query parsing", () => {
  const { ctx } = build(
    [doc({ title: "Floor markers", bodyText: "Remove the marker from the floor; sideways light; front of lens; c-stand" })],
    [{ kind: "narrower", broader: "marker", terms: ["tracker"] }],
  );
  const parse = (q: string, exact = false) => parseQuery(q, ctx, { prefix: "none", exact });

  it("never corrects a word of the English word list, and corrects other misspellings", () => {
    expect(parse("flor markers").units[0]?.correction).toBeUndefined();
    expect(parse("floar markers").units[0]?.correction).toBe("floor");
    expect(parse("floar markers", true).units[0]?.correction).toBeUndefined();
  });

  it("gives a real word that no page uses a weak look at page words one edit away, without a correction", () => {
    const u = parse("flor").units[0];
    expect(u?.alternatives.map((a) => [a.surface, a.weight])).toEqual([["floor", ALTERNATIVE_WEIGHTS.nearWord]]);
  });

  it("splits a run-together word only when the whole is not a word", () => {
    expect(parse("infront").units[0]?.alternatives.some((a) => a.kind === "split")).toBe(true);
    expect(parse("sideways").units[0]?.alternatives.some((a) => a.kind === "split")).toBe(false);
  });

  it("keeps c-stand whole and adds its head word as a weaker alternative", () => {
    const alts = parse("c-stand").units[0]?.alternatives ?? [];
    expect(alts.map((a) => a.kind)).toEqual(["exact", "parts"]);
    expect(alts[1]?.weight).toBeLessThan(alts[0]?.weight as number);
  });

  it("adds thesaurus terms with less weight than the word typed", () => {
    const alts = parse("tracker").units[0]?.alternatives ?? [];
    expect(alts.map((a) => [a.kind, a.surface])).toContainEqual(["broader", "marker"]);
    expect(ALTERNATIVE_WEIGHTS.broader).toBeLessThan(ALTERNATIVE_WEIGHTS.exact);
    expect(ALTERNATIVE_WEIGHTS.synonym).toBeLessThan(ALTERNATIVE_WEIGHTS.exact);
  });

  it("reaches a problem name through the symptom lexicon, under a page that says the word itself", () => {
    const docs = [doc({ title: "Flattening an uneven screen" }), doc({ title: "Blotchy skin tones" }), doc({ title: "Marker removal" })];
    const { ctx, scorer } = build(docs);
    const lexiconCtx = { ...ctx, thesaurus: compileThesaurus([], (w) => ctx.vocab.stemOf(w), [{ means: ["uneven"], seen: ["blotchy"] }]) };
    const plan = parseQuery("blotchy", lexiconCtx, { prefix: "none", exact: false });
    const related = plan.units[0]?.alternatives.find((a) => a.kind === "related");
    expect(related?.weight).toBe(ALTERNATIVE_WEIGHTS.related);
    expect(ALTERNATIVE_WEIGHTS.related).toBeLessThan(ALTERNATIVE_WEIGHTS.broader);
    const s = scorer.score(plan, 0b1111111, docs.length);
    expect([...s.ids].sort()).toEqual([0, 1]);
    expect(s.scores[s.ids.indexOf(1)]).toBeGreaterThan(s.scores[s.ids.indexOf(0)] as number);
    // The reader is told the link is the built-in symptom words', not a lead's entry.
    const unevenStem = ctx.vocab.stemIdOf(ctx.vocab.stemOf("uneven"));
    expect(thesaurusMatches(plan, (sid) => sid === unevenStem, "blotchy")).toEqual([{ word: "blotchy", term: "uneven", kind: "broader", source: "lexicon" }]);
  });

  it("weighs filler words little", () => {
    const p = parse("how do i get rid of floor markers");
    expect(p.units.map((u) => [u.text, u.weight])).toEqual([
      ["get", 0.15],
      ["rid", 0.15],
      ["floor", 1],
      ["markers", 1],
    ]);
  });

  it("weighs a preposition like a generic word, so the words that name things decide", () => {
    expect(parse("wire against the sky").units.map((u) => [u.text, u.weight])).toEqual([
      ["wire", 1],
      ["against", 0.5],
      ["sky", 1],
    ]);
  });
});

describe("scoring", () => {
  it("follows the non-negative BM25 IDF, log(1 + (N − n + 0.5) / (n + 0.5))", () => {
    // Formula from Lucene's BM25Similarity documentation; ln(1 + 9.5 / 1.5) = ln(7.3333…) = 1.99243 (from memory).
    expect(bm25Idf(10, 1)).toBeCloseTo(1.99243, 4);
    expect(bm25Idf(1000, 5)).toBeGreaterThan(bm25Idf(1000, 500));
  });

  it("keeps every page that matches any word (no coverage gate), a rare title word above common body words", () => {
    const docs = [
      doc({ title: "Window reflections", bodyText: "glass" }),
      doc({ title: "Car bodywork", bodyText: "shiny guy shiny guy in the paint" }),
      ...Array.from({ length: 8 }, (_, i) => doc({ title: `Other ${i}`, bodyText: "guy in shot" })),
    ];
    const { ctx, scorer } = build(docs);
    const plan = parseQuery("shiny guy window", ctx, { prefix: "none", exact: false });
    const s = scorer.score(plan, 0b1111111, docs.length);
    expect(s.ids.length).toBe(10);
    const at = (id: number) => s.scores[s.ids.indexOf(id)] as number;
    expect(at(0)).toBeGreaterThan(at(2));
    expect(s.coverage[s.ids.indexOf(1)]).toBeCloseTo(2 / 3, 5);
  });

  it("counts a word once among the title, aliases and tags, by the best of them; the summary and body still add", () => {
    // Per-field BM25 weights (title 6, aliases 4, tags 4, summary 4, body 1) and the saturation
    // tf / (tf + K1 · (1 − b + b · length / average)) are scoring.ts's own; the test compares pages
    // whose fields have equal lengths, so only which fields hold the word differs.
    const tag = (name: string) => ({ slug: name, name, kind: "problem" as const, aliases: [] });
    const docs = [
      doc({ title: "Shutter lean", aliases: ["skew fix"], tags: [tag("camera")] }),
      doc({ title: "Shutter lean", aliases: ["shutter fix"], tags: [tag("shutter")] }),
      doc({ title: "Other lean", aliases: ["shutter fix"], tags: [tag("camera")] }),
      doc({ title: "Other lean", aliases: ["skew fix"], tags: [tag("shutter")] }),
      doc({ title: "Shutter lean", aliases: ["skew fix"], tags: [tag("camera")], summary: "The shutter leans." }),
      ...Array.from({ length: 5 }, (_, i) => doc({ title: `Page ${i}`, aliases: ["skew fix"], tags: [tag("camera")] })),
    ];
    const { ctx, scorer } = build(docs);
    const s = scorer.score(parseQuery("shutter", ctx, { prefix: "none", exact: false }), 0b1111111, docs.length);
    const score = (id: number) => s.scores[s.ids.indexOf(id)] as number;
    // The title alone, or the title with an alias and a tag saying it again: the same.
    expect(score(1)).toBeCloseTo(score(0), 10);
    // An alias or a tag alone counts less than the title (weight 4 against 6).
    expect(score(2)).toBeLessThan(score(0));
    expect(score(3)).toBeLessThan(score(0));
    // The summary is a sentence about the problem, not another name: it adds.
    expect(score(4)).toBeGreaterThan(score(0));
    // The naming part (ranking's rule 4) is the title's, not title plus alias.
    expect(s.naming[s.ids.indexOf(1)]).toBeCloseTo(s.naming[s.ids.indexOf(0)] as number, 10);
  });

  it("lets a word met only in a long body cover its query word in part, by BM25's term-frequency part", () => {
    // BM25's term-frequency part (K1 + 1) · tf / (tf + K1 · (1 − b + b · length / average)), K1 1.2 and
    // b 0.75 for the body (Robertson and Zaragoza, "The Probabilistic Relevance Framework: BM25 and
    // Beyond", 2009 — formula from memory): 1 for one mention at average length, capped at 1.
    const filler = (n: number, from = 0) => Array.from({ length: n }, (_, i) => `w${from + i}x`).join(" ");
    const docs = [
      doc({ title: "Alpha", bodyText: `crane ${filler(9)}` }),
      doc({ title: "Beta", bodyText: `crane ${filler(59, 100)}` }),
      doc({ title: "Gamma", summary: "A crane in shot.", bodyText: filler(59, 200) }),
      doc({ title: "Delta", bodyText: `crane crane crane ${filler(57, 300)}` }),
      ...Array.from({ length: 6 }, (_, i) => doc({ title: `Other ${i}`, bodyText: filler(10, 400 + 10 * i) })),
    ];
    const { ctx, scorer } = build(docs);
    const s = scorer.score(parseQuery("crane", ctx, { prefix: "none", exact: false }), 0b1111111, docs.length);
    const coverage = (id: number) => s.coverage[s.ids.indexOf(id)] as number;
    const average = (10 + 60 + 59 + 60 + 6 * 10) / 10;
    const tfPart = (tf: number, length: number) => (2.2 * tf) / (tf + 1.2 * (0.25 + (0.75 * length) / average));
    expect(coverage(0)).toBe(1); // a short body: the part is over 1, capped
    expect(coverage(1)).toBeCloseTo(tfPart(1, 60), 5); // ≈ 0.58: one mention in a body 2.4 times the average
    expect(coverage(2)).toBe(1); // named in the summary: covered whatever the body's length
    expect(coverage(3)).toBeCloseTo(Math.min(1, tfPart(3, 60)), 5); // three mentions count more than one
    expect(coverage(3)).toBeGreaterThan(coverage(1));
  });

  it("lets a thesaurus term on most of many pages add to pages the word found, but bring in none of its own", () => {
    const docs = [
      doc({ title: "Crash mats", bodyText: "pads" }),
      doc({ title: "Landing pads on the ground" }),
      ...Array.from({ length: 298 }, (_, i) => doc({ title: `Other ${i}`, bodyText: "pads everywhere" })),
    ];
    const { ctx, scorer } = build(docs, [{ kind: "synonyms", terms: ["mat", "pad"] }]);
    const plan = parseQuery("mats", ctx, { prefix: "none", exact: false });
    expect(plan.units[0]?.alternatives.map((a) => a.kind)).toEqual(["exact", "synonym"]);
    const s = scorer.score(plan, 0b1111111, docs.length);
    // "pad" is on 300 of 300 pages: only page 0, found by "mats" itself, is a candidate.
    expect(s.ids).toEqual([0]);
    // Where no page says the word typed, the same term finds its pages.
    const { ctx: ctx2, scorer: scorer2 } = build(docs.slice(1), [{ kind: "synonyms", terms: ["mat", "pad"] }]);
    const s2 = scorer2.score(parseQuery("mats", ctx2, { prefix: "none", exact: false }), 0b1111111, docs.length - 1);
    expect(s2.ids.length).toBe(299);
  });
});

describe("ranking rules", () => {
  const item = (id: number, score: number, naming: number, extra: Partial<RankItem> = {}): RankItem => ({ id, score, naming, coverage: 1, isApproved: true, isRetired: false, isHouseHit: false, ...extra });

  it("grades by coverage without cutting", () => {
    expect(gradedScore(10, 1)).toBe(10);
    expect(gradedScore(10, 0.25)).toBeCloseTo(10 * Math.pow(0.25, RANKING.coveragePower), 9);
    expect(gradedScore(10, 0.25)).toBeGreaterThan(0);
  });

  it("leaves out weak partial matches but keeps every page that answers all the words", () => {
    const kept = aboveFloor([item(1, 100, 0), item(2, 5, 0, { coverage: 0.5 }), item(3, 5, 0, { coverage: 1 }), item(4, 20, 0, { coverage: 0.5 })]);
    expect(kept.map((x) => x.id)).toEqual([1, 3, 4]);
  });

  it("puts approved before drafts among good matches, and retired last", () => {
    const top = 10;
    const draft = item(1, 10, 0, { isApproved: false });
    const approved = item(2, 7, 0);
    const retired = item(3, 12, 0, { isRetired: true });
    expect(bestScore([draft, approved, retired])).toBe(10);
    const key = (x: RankItem) => rankKey(x.score, x.isApproved, x.isRetired, top);
    const sorted = [draft, approved, retired].sort((a, b) => key(b) - key(a));
    expect(sorted.map((x) => x.id)).toEqual([2, 1, 3]);
  });

  it("promotes a close department method, but never past a page that names the query better", () => {
    const better = item(1, 10, 8);
    const weaker = item(2, 9.5, 2);
    const house = item(3, 9, 4, { isHouseHit: true });
    expect(promoteHouseMethods([better, weaker, house], 10).map((x) => x.id)).toEqual([1, 3, 2]);
    const far = item(4, 5, 9, { isHouseHit: true });
    expect(promoteHouseMethods([better, weaker, far], 10).map((x) => x.id)).toEqual([1, 2, 4]);
  });

  it("says which problem tags a query is about, including a tag filter", () => {
    const phrases = new Map([
      ["dust-and-scratches", [["dust", "scratch"], ["dust"], ["scratch"]]],
      ["sensor-dust", [["sensor", "dust"]]],
    ]);
    expect([...problemTagsHit(phrases, new Set(["sensor", "dust"]), [])].sort()).toEqual(["dust-and-scratches", "sensor-dust"]);
    expect([...problemTagsHit(phrases, new Set(["dust"]), [])]).toEqual(["dust-and-scratches"]);
    expect([...problemTagsHit(phrases, new Set(), ["sensor-dust"])]).toEqual(["sensor-dust"]);
  });
});

describe("snippets", () => {
  const { ctx, vocab } = build([doc({ title: "Marker removal", bodyText: "Sample the markers. ".repeat(20) })], [{ kind: "narrower", broader: "marker", terms: ["tracker"] }]);
  const d = doc({ title: "Marker removal", summary: "On blue", bodyText: "Start here. ".repeat(20) + "Sample the markers and the screen." });

  it("highlights exactly the matched words and cuts the body around them", () => {
    const stemOf = (w: string) => vocab.stemOf(w);
    const { matches, snippet } = matchesFor(d, { stems: new Set(["marker"]), words: new Set(["marker", "markers"]), hasPairs: false, stemOf });
    const title = matches.find((m) => m.field === "title");
    expect(title?.ranges.map(([s, e]) => title.value.slice(s, e))).toEqual(["Marker"]);
    const body = matches.find((m) => m.field === "body");
    expect(body?.ranges.map(([s, e]) => body.value.slice(s, e))).toEqual(["markers"]);
    expect(snippet.startsWith("…")).toBe(true);
  });

  it("says which query word matched only through the thesaurus", () => {
    const plan = parseQuery("tracker removal", ctx, { prefix: "none", exact: false });
    const markerStem = vocab.stemIdOf(vocab.stemOf("marker"));
    const removalStem = vocab.stemIdOf(vocab.stemOf("removal"));
    const via = thesaurusMatches(plan, (sid) => sid === markerStem || sid === removalStem, "tracker removal");
    expect(via).toEqual([{ word: "tracker", term: "marker", kind: "broader", source: "thesaurus" }]);
  });
});
