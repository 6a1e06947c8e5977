import { createSearchIndex } from "@/lib/search/engine";
import { loadLanguage } from "@/lib/search/language";
import { STARTER_THESAURUS } from "@/db/seed-data/thesaurus";
import { QUALITY_PAGES } from "@/tests/unit/search/quality/pages";
const index = createSearchIndex({ language: await loadLanguage(), thesaurus: STARTER_THESAURUS });
index.load(QUALITY_PAGES.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
for (const q of process.argv.slice(2)) {
  const r = index.search(q, { audience: "published", limit: 6 });
  console.log(`\n${q}  (corrected: ${r.corrected ?? "-"}, total ${r.total})`);
  for (const x of r.results) console.log(`  ${x.score.toFixed(2)} ${x.isHouseMethod ? "H" : " "} ${x.slug}  via=${JSON.stringify(x.via)}`);
}
