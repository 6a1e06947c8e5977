import { describe, expect, it, vi } from "vitest";

import { createSearchIndex } from "@/lib/search/engine";
import { createLanguage } from "@/lib/search/language";
import { createMeaning, dot, type Meaning, MeaningVectors, type MeaningVectorStore, meaningText, RERANK_WINDOW, rerankByMeaning, searchWithMeaning } from "@/lib/search/meaning";
import { sentenceEncoder } from "@/lib/search/meaning-model";
import { searchDoc } from "@/tests/unit/search/search-doc";

// Ranking by meaning (issue 16): the re-ordering rule is Plateroom's own; the encoder is Universal
// Sentence Encoder Lite (Cer et al. 2018, "Universal Sentence Encoder", arXiv:1803.11175).

const unit = (...v: number[]): Float32Array => {
  const n = Math.hypot(...v);
  return Float32Array.from(v.map((x) => x / n));
};

describe("rerankByMeaning", () => {
  const results = [
    { slug: "a", score: 10 },
    { slug: "b", score: 9 },
    { slug: "c", score: 5 },
  ];
  const vectors: Record<string, Float32Array> = { a: unit(0, 1), b: unit(0.2, 1), c: unit(1, 0) };

  it("lifts a page whose meaning is much closer to the query over a better word match", () => {
    // c: 0.5 · 5/10 + 0.5 · 2 · 1 = 1.25; a: 0.5 · 1 + 0 = 0.5; b: 0.45 + 0.5 · 2 · 0.196 = 0.65.
    const out = rerankByMeaning(results, unit(1, 0), (r) => vectors[r.slug]);
    expect(out.map((r) => r.slug)).toEqual(["c", "b", "a"]);
  });

  it("keeps the engine's order when the meanings are equally close", () => {
    const same = unit(1, 1);
    expect(rerankByMeaning(results, unit(1, 0), () => same).map((r) => r.slug)).toEqual(["a", "b", "c"]);
  });

  it("gives a page without a vector its engine score for meaning too", () => {
    // a without vector: 0.5 + 0.5 = 1.0; c: 0.25 + 0.5 · 2 · 0.6 = 0.85.
    const out = rerankByMeaning(results.slice(0, 1).concat(results[2] as (typeof results)[number]), unit(1, 0), (r) => (r.slug === "c" ? unit(0.6, 0.8) : undefined));
    expect(out.map((r) => r.slug)).toEqual(["a", "c"]);
  });

  it("moves nothing beyond the first RERANK_WINDOW results and nothing in a list of one", () => {
    const long = Array.from({ length: RERANK_WINDOW + 3 }, (_, i) => ({ slug: `p${i}`, score: 100 - i }));
    const last = long.at(-1) as (typeof long)[number];
    const out = rerankByMeaning(long, unit(1, 0), (r) => (r === last ? unit(1, 0) : unit(0, 1)));
    expect(out.slice(RERANK_WINDOW)).toEqual(long.slice(RERANK_WINDOW));
    expect(new Set(out.slice(0, RERANK_WINDOW))).toEqual(new Set(long.slice(0, RERANK_WINDOW)));
    expect(rerankByMeaning([results[2] as (typeof results)[number]], unit(1, 0), () => unit(1, 0))).toEqual([results[2]]);
  });
});

describe("MeaningVectors", () => {
  it("encodes each text once, one call a text, at page priority unless asked, and forgets texts no page uses", async () => {
    const calls: string[] = [];
    const vectors = new MeaningVectors((texts, priority) => {
      calls.push(`${texts.join("+")}:${priority}`);
      return Promise.resolve(texts.map((t) => unit(t.length, 1)));
    });
    await vectors.ensure(["a", "bb", "a", "ccc"], undefined, 2);
    await vectors.ensure(["bb", "dddd"], "query");
    expect(calls).toEqual(["a:pages", "bb:pages", "ccc:pages", "dddd:query"]);
    expect(vectors.get("bb")).toEqual(unit(2, 1));
    await vectors.keepOnly(["a"]);
    expect(vectors.size).toBe(1);
    expect(vectors.get("bb")).toBeUndefined();
  });

  /** A store in memory, counting what it was asked; `failing` makes every call reject. */
  function memoryStore(failing = false) {
    const rows = new Map<string, Float32Array>();
    const asked: string[][] = [];
    const store: MeaningVectorStore = {
      load: (texts) => {
        asked.push([...texts]);
        if (failing) return Promise.reject(new Error("store down"));
        return Promise.resolve(new Map(texts.flatMap((t) => (rows.has(t) ? [[t, rows.get(t) as Float32Array] as const] : []))));
      },
      save: (entries) => {
        if (failing) return Promise.reject(new Error("store down"));
        for (const [t, v] of entries) rows.set(t, v);
        return Promise.resolve();
      },
      keepOnly: (texts) => {
        if (failing) return Promise.reject(new Error("store down"));
        for (const t of [...rows.keys()]) if (!texts.includes(t)) rows.delete(t);
        return Promise.resolve();
      },
    };
    return { store, rows, asked };
  }

  it("reads stored vectors instead of encoding again, and stores what it encodes", async () => {
    const { store, rows, asked } = memoryStore();
    rows.set("kept", unit(3, 4));
    const encoded: string[] = [];
    const vectors = new MeaningVectors((texts) => {
      encoded.push(...texts);
      return Promise.resolve(texts.map((t) => unit(t.length, 1)));
    });
    vectors.store = store;
    await vectors.ensure(["kept", "new"]);
    expect(encoded).toEqual(["new"]);
    expect(vectors.get("kept")).toEqual(unit(3, 4));
    expect(rows.get("new")).toEqual(unit(3, 1));
    // Texts already in memory are not asked of the store again.
    await vectors.ensure(["kept", "new"]);
    expect(asked).toEqual([["kept", "new"]]);
    await vectors.keepOnly(["new"]);
    expect([...rows.keys()]).toEqual(["new"]);
  });

  it("encodes as before when the store fails, and says so once per failure", async () => {
    const { store } = memoryStore(true);
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const vectors = new MeaningVectors((texts) => Promise.resolve(texts.map(() => unit(1, 0))));
    vectors.store = store;
    await vectors.ensure(["a"]);
    await vectors.keepOnly(["a"]);
    expect(vectors.get("a")).toEqual(unit(1, 0));
    expect(errors.mock.calls.map((c) => String(c[0]))).toEqual([
      "search: reading stored page vectors failed (a cache: pages are encoded when needed)",
      "search: saving stored page vectors failed (a cache: pages are encoded when needed)",
      "search: pruning stored page vectors failed (a cache: pages are encoded when needed)",
    ]);
    errors.mockRestore();
  });
});

describe("searchWithMeaning", () => {
  // A fake encoder with two directions: texts about water, and everything else.
  const encoded: string[] = [];
  const encode = (texts: readonly string[]) => {
    encoded.push(...texts);
    return Promise.resolve(texts.map((t) => (/rain|water|wet/i.test(t) ? unit(1, 0) : unit(0, 1))));
  };
  const meaning = (): Meaning => createMeaning(encode);
  const index = createSearchIndex({ language: createLanguage(["rain", "on", "the", "lens", "dust", "drops"], []) });
  const pages = [
    searchDoc({ title: "Dust on the lens", summary: "Lens dust: spots that stay put.", bodyText: "lens lens lens drops" }),
    searchDoc({ title: "Rain drops", summary: "Water on the glass in front of the lens.", bodyText: "lens" }),
    searchDoc({ title: "Lens flare", summary: "Bright streaks.", bodyText: "lens" }),
  ];
  index.load(pages.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
  const opts = { audience: "published" as const };

  it("re-orders the engine's results by meaning and keeps which pages match", async () => {
    const byWords = index.search("lens drops rain", opts);
    const ranked = await searchWithMeaning(index, "lens drops rain", opts, meaning());
    expect(ranked.results.map((r) => r.slug).sort()).toEqual(byWords.results.map((r) => r.slug).sort());
    expect(ranked.results[0]?.slug).toBe("rain-drops");
    expect(ranked.total).toBe(byWords.total);
  });

  it("encodes the query as the engine corrected it", async () => {
    encoded.length = 0;
    const res = await searchWithMeaning(index, "lesn drops", opts, meaning());
    expect(res.corrected).toBe("lens drops");
    expect(encoded[0]).toBe("lens drops");
  });

  it("encodes a word the pages spell the other way, British or American, in the pages' spelling, and shows no correction", async () => {
    // Pairs as the British and American Hunspell dictionaries give them (language.ts).
    const spelt = createSearchIndex({ language: createLanguage(["grey", "gray", "sky", "colour", "color", "colours", "colors", "marker", "markers"], [["grey", "gray"], ["colour", "color"]]) });
    const docs = [
      searchDoc({ title: "Grey sky lift", summary: "Colours of a grey sky.", bodyText: "marker" }),
      searchDoc({ title: "Sky replacement", summary: "A new sky.", bodyText: "sky" }),
    ];
    spelt.load(docs.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
    encoded.length = 0;
    const res = await searchWithMeaning(spelt, "gray sky colors markers", opts, meaning());
    // "markers" is an inflection of the pages' "marker", not another spelling: it stays as typed.
    expect(encoded[0]).toBe("grey sky colours markers");
    expect(res.corrected).toBeUndefined();
    encoded.length = 0;
    await searchWithMeaning(spelt, "grey sky", opts, meaning());
    expect(encoded[0]).toBe("grey sky");
  });

  it("starts encoding the query, as corrected and ahead of waiting pages, before the engine scores pages", async () => {
    const steps: string[] = [];
    const watched: Pick<typeof index, "search"> = {
      search: (q, o, onPlanned) => {
        steps.push("engine starts");
        const res = index.search(q, o, onPlanned);
        steps.push("engine ends");
        return res;
      },
    };
    const m = createMeaning((texts, priority) => {
      steps.push(`encode ${texts.join("+")} (${priority})`);
      return encode(texts);
    });
    await searchWithMeaning(watched, "lesn drops", opts, m);
    expect(steps.slice(0, 3)).toEqual(["engine starts", "encode lens drops (query)", "engine ends"]);
    // The top's pages, not encoded yet, go at the query's priority too.
    expect(steps.slice(3).every((s) => s.endsWith("(query)"))).toBe(true);
    expect(steps.length).toBeGreaterThan(3);
  });

  it("keeps the engine's order, and says why once, when the encoder fails", async () => {
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const stopped = new Error("worker stopped");
    const failing = createMeaning(() => Promise.reject(stopped));
    for (let i = 0; i < 3; i++) {
      const res = await searchWithMeaning(index, "lens drops", opts, failing);
      expect(res.results.length).toBeGreaterThan(1);
      expect(res.results.map((r) => r.slug)).toEqual(index.search("lens drops", opts).results.map((r) => r.slug));
    }
    expect(errors).toHaveBeenCalledTimes(1);
    expect(String(errors.mock.calls[0]?.[0])).toMatch(/ranking by meaning failed/);
    errors.mockRestore();
  });

  it("applies limit and offset after re-ordering, so pages do not repeat or go missing", async () => {
    const m = meaning();
    const all = (await searchWithMeaning(index, "lens", opts, m)).results.map((r) => r.slug);
    const first = (await searchWithMeaning(index, "lens", { ...opts, limit: 1 }, m)).results.map((r) => r.slug);
    const rest = (await searchWithMeaning(index, "lens", { ...opts, offset: 1, limit: 5 }, m)).results.map((r) => r.slug);
    expect([...first, ...rest]).toEqual(all);
    expect(all).toHaveLength(3);
  });

  it("leaves lists by date, empty queries and a missing encoder to the engine", async () => {
    encoded.length = 0;
    for (const [q, o] of [
      ["lens", { ...opts, sort: "recent" as const }],
      ["", opts],
    ] as const)
      expect(await searchWithMeaning(index, q, o, meaning())).toEqual({ ...index.search(q, o), tookMs: expect.any(Number) });
    expect(encoded).toEqual([]);
    expect((await searchWithMeaning(index, "lens drops rain", opts, null)).results.map((r) => r.slug)).toEqual(index.search("lens drops rain", opts).results.map((r) => r.slug));
  });
});

describe("the sentence encoder (Universal Sentence Encoder Lite)", async () => {
  const encode = await sentenceEncoder();

  it("loads from the installed package and gives 512-dimensional unit vectors", async () => {
    expect(encode).not.toBeNull();
    const [v] = await (encode as NonNullable<typeof encode>)(["hello"]);
    expect(v).toHaveLength(512);
    expect(dot(v as Float32Array, v as Float32Array)).toBeCloseTo(1, 5);
  });

  it("places paraphrases closer than unrelated sentences", async () => {
    // Sentence pairs in the style of the model's published similarity examples (from memory: the
    // TF Hub notebook compares "How old are you?" with "What is your age?"); the ordering, not a
    // number, is what the model is known for.
    const [age1, age2, weather, phone1, phone2] = await (encode as NonNullable<typeof encode>)([
      "How old are you?",
      "What is your age?",
      "It will rain tomorrow.",
      "My phone is good.",
      "Your cellphone looks great.",
    ]);
    const sim = (a?: Float32Array, b?: Float32Array) => dot(a as Float32Array, b as Float32Array);
    expect(sim(age1, age2)).toBeGreaterThan(sim(age1, weather) + 0.2);
    expect(sim(phone1, phone2)).toBeGreaterThan(sim(phone1, age2) + 0.2);
  });

  it("answers a search's query before pages that were waiting to be encoded", async () => {
    const enc = encode as NonNullable<typeof encode>;
    const order: string[] = [];
    // Pages near the encoder's 128-token limit (a few ms each), so the queue outlasts the posting.
    const body = "Dust spots on the lens, removed frame by frame with a clean patch from a neighbouring frame. ".repeat(6);
    const pages = Array.from({ length: 24 }, (_, i) => enc([`Page ${i}: ${body}`], "pages").then(() => order.push(`page ${i}`)));
    const query = enc(["tracking markers on a green screen"], "query").then(() => order.push("query"));
    await Promise.all([...pages, query]);
    // The worker runs beside this thread and may finish a page or two while the messages are still
    // being posted (seen on a loaded machine), so the check is that the query jumped the queue, not
    // exactly where: in arrival order it would be last.
    expect(order.indexOf("query")).toBeLessThan(pages.length / 2);
    expect(order.filter((o) => o !== "query")).toEqual(pages.map((_, i) => `page ${i}`));
  });

  it("reads a page's title, summary, aliases and tag names", () => {
    expect(meaningText(searchDoc({ title: "Rain drops", summary: "Water on glass.", aliases: ["droplets"], tags: [{ slug: "lens", name: "Lens", kind: "problem", aliases: [] }] }))).toBe(
      "Rain drops. Water on glass. droplets. Lens.",
    );
  });
});
