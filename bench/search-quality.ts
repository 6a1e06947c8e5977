/**
 * `npx tsx -C react-server bench/search-quality.ts`: the quality set alone, for tuning. Prints the
 * per-kind table for the tuned queries and the held-out ones, and lists misses of the TUNED queries
 * only (the held-out quarter is never listed: look at its numbers, not its queries).
 * Ranks with meaning as the product does; `--words` ranks by the engine alone.
 */
import { createSearchIndex } from "@/lib/search/engine";
import { loadLanguage } from "@/lib/search/language";
import { createMeaning } from "@/lib/search/meaning";
import { sentenceEncoder } from "@/lib/search/meaning-model";
import { STARTER_THESAURUS } from "@/scripts/seed/data/thesaurus";
import { QUALITY_PAGES } from "@/tests/unit/search/quality/pages";
import { QUALITY_QUERIES } from "@/tests/unit/search/quality/queries";
import { UNSEEN_SETS } from "@/tests/unit/search/quality/unseen-sets";

import { byWords, byWordsThenMeaning, evaluateQuality, hunspellJudge } from "./lib/quality";

const index = createSearchIndex({ language: await loadLanguage(), thesaurus: STARTER_THESAURUS });
index.load(QUALITY_PAGES.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
const judge = await hunspellJudge(QUALITY_PAGES);
const encode = process.argv.includes("--words") ? null : await sentenceEncoder();
const meaning = encode && createMeaning(encode);
const search = meaning ? byWordsThenMeaning(index, meaning) : byWords(index);
console.log(meaning ? "ranked by words, then meaning" : "ranked by words alone");
const report = await evaluateQuality(search, QUALITY_QUERIES, judge);
console.log("tuned");
console.table(report.tuned);
if (process.argv.includes("--batches"))
  for (const [batch, rows] of Object.entries(report.tunedBatches)) {
    console.log(`tuned, ${batch}`);
    console.table(rows.filter((r) => r.queries > 0));
  }
// While tuning, leave the held-out numbers unseen too; `--held-out` shows them (for reports).
if (process.argv.includes("--held-out")) {
  console.log("held out (misses never listed)");
  console.table(report.heldOut);
  if (process.argv.includes("--batches"))
    for (const [batch, rows] of Object.entries(report.heldOutBatches)) {
      console.log(`held out, ${batch} batch`);
      console.table(rows.filter((r) => r.queries > 0));
    }
}
console.log("real words corrected", report.realWordsCorrected);
if (process.argv.includes("--misses")) console.log(report.tunedMisses.join("\n"));

// `--unseen`: the set written apart on pages no tuning saw (held out whole: numbers only, never misses),
// over those pages alone — mixed into the quality pages its answers would be ambiguous (both sets
// cover the same problems).
if (process.argv.includes("--unseen")) {
  for (const { name, pages, writers } of UNSEEN_SETS) {
    const unseenIndex = createSearchIndex({ language: await loadLanguage(), thesaurus: STARTER_THESAURUS });
    unseenIndex.load(pages.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
    const unseenJudge = await hunspellJudge(pages);
    const unseenMeaning = encode && createMeaning(encode);
    const unseenSearch = unseenMeaning ? byWordsThenMeaning(unseenIndex, unseenMeaning) : byWords(unseenIndex);
    for (const { writer, queries } of writers) {
      const unseenReport = await evaluateQuality(unseenSearch, queries, unseenJudge, () => true);
      console.log(`${name} (held out whole), queries by ${writer}`);
      console.table(unseenReport.all);
      console.log("real words corrected", unseenReport.realWordsCorrected);
    }
  }
}
