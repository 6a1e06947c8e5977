/**
 * Deterministic synthetic technique corpora for the search benchmark. Field lengths aim at what a
 * department writes: 3–9 word titles, a 10–25 word summary, 0–3 aliases, 1–2 problem tags and 0–2
 * plate tags, 0–8 parameter names, 0–12 shot codes and a 60–600 word body (mean ≈ 250). Words follow a
 * Zipf-like distribution over stop words, trade words and a long tail of generated rare words, so
 * posting lists have realistic lengths and the vocabulary grows with the corpus.
 */
import type { SearchDocument, SearchStatus, SearchTag } from "@/lib/search/types";
import { TAGS } from "@/tests/unit/search/quality/pages";
import { mulberry32 } from "@/lib/random";

export const rng = mulberry32;

type Rand = () => number;
const pick = <T>(r: Rand, list: readonly T[]): T => list[Math.floor(r() * list.length)] as T;
const between = (r: Rand, lo: number, hi: number): number => lo + Math.floor(r() * (hi - lo + 1));

const STOP = "the a of and to in on for with is it that this as by be or from at are when then if so".split(" ");
const COMMON =
  ("use make keep take set start finish work apply avoid watch note try need look see move hold build replace remove restore " +
    "reduce increase lower raise adjust blend mix merge combine copy shift pick choose select animate export render check compare " +
    "review frame frames shot shots plate plates edge edges detail area areas value values side sides top bottom left right " +
    "first last next before after over under inside outside small large thin wide soft hard fast slow clean good bad whole each every " +
    "often usually always never only still again also more less most least much many few same different other new old own").split(" ");
const TRADE =
  ("matte mattes grain noise denoise regrain channel channels gain erode dilate blur key keying keyer screen backing green blue " +
    "marker markers tracking track tracker planar stabilise roto paint patch clone offset lens distortion flare spill despill sky " +
    "skin water night exterior interior wire wires rig harness dust scratch dirt pixel pixels dead stuck reflection shadow boom crew " +
    "logo sign seam tape crease light lighting colour match matrix luminance chroma saturation contrast highlight midtones curve " +
    "levels black white point ramp soften feather mask garbage core holdout foreground background motion vector temporal median " +
    "average difference divide multiply premultiply alpha texture fine smooth flat uneven bright dark warm cool hue tint fill source " +
    "target sample reference resolution proxy scale transform warp mesh spline shape corner pin solve camera focus defocus depth " +
    "sharpen artefact banding compression block chatter flicker deflicker jitter wobble rolling shutter skew retime interpolation " +
    "overscan crop format scan film digital sensor exposure gamma linear log encoding display viewer wipe checker overlay edge hair " +
    "strand costume actor talent stunt cable stand crane mat footprint tyre smoke rain snow haze glass window car mirror chrome " +
    "bodywork tattoo blemish wrinkle sweat earpiece microphone monitor phone bird aircraft contrail debris river sea pool wave").split(" ");

const SYLLABLES = "ba be bi bo bu ka ke ki ko ku la le li lo lu ma me mi mo mu na ne ni no nu ra re ri ro ru sa se si so su ta te ti to tu va ve vi vo zu tra pre sto gle mar len dor vin qui fal shen brok tal".split(" ");

/** Word list ordered by assumed frequency, with cumulative Zipf weights for sampling. */
function buildLexicon(tailSize: number): { words: string[]; cumulative: Float64Array } {
  const r = rng(7);
  const tail = new Set<string>();
  while (tail.size < tailSize) {
    let w = "";
    const n = between(r, 2, 4);
    for (let i = 0; i < n; i++) w += pick(r, SYLLABLES);
    tail.add(w);
  }
  const words = [...STOP, ...COMMON, ...TRADE, ...tail];
  const cumulative = new Float64Array(words.length);
  let sum = 0;
  for (let i = 0; i < words.length; i++) {
    sum += 1 / Math.pow(i + 1, 0.95);
    cumulative[i] = sum;
  }
  for (let i = 0; i < words.length; i++) cumulative[i] = (cumulative[i] as number) / sum;
  return { words, cumulative };
}

const LEXICON = buildLexicon(40_000);

function word(r: Rand): string {
  const x = r();
  const c = LEXICON.cumulative;
  let lo = 0;
  let hi = c.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((c[mid] as number) < x) lo = mid + 1;
    else hi = mid;
  }
  return LEXICON.words[lo] as string;
}

function sentence(r: Rand, extra: readonly string[]): string {
  const n = between(r, 8, 20);
  const out: string[] = [];
  for (let i = 0; i < n; i++) out.push(extra.length > 0 && r() < 0.08 ? pick(r, extra) : word(r));
  const s = out.join(" ");
  return s.charAt(0).toUpperCase() + s.slice(1) + ".";
}

function paragraph(r: Rand, words: number, extra: readonly string[]): string {
  const parts: string[] = [];
  let count = 0;
  while (count < words) {
    const s = sentence(r, extra);
    parts.push(s);
    count += s.split(" ").length;
  }
  return parts.join(" ");
}

const tag = (slug: string, name: string, kind: SearchTag["kind"], aliases: string[] = []): SearchTag => ({ slug, name, kind, aliases });

/**
 * Problem tags of the synthetic techniques, with the things a technique under them removes or repairs.
 * They are deliberately other problems than the quality fixture's: with hundreds of synthetic "dead
 * pixel repair" techniques every one would be an equally right answer and "top 3" would mean nothing.
 * They still share plate tags and the trade vocabulary with the fixture (titles, summaries, bodies),
 * so they compete for the same words, inflate posting lists and the typo-correction vocabulary.
 */
const PROBLEMS: { tag: SearchTag; objects: string[] }[] = [
  { tag: tag("lens-flare", "Lens flare", "problem", ["flares", "ghosts"]), objects: ["lens flares", "flare ghosts", "veiling glare"] },
  { tag: tag("flicker", "Flicker", "problem", ["deflicker", "strobing"]), objects: ["flicker", "light strobing", "exposure pumping"] },
  { tag: tag("rolling-shutter", "Rolling shutter", "problem", ["skew", "jello"]), objects: ["rolling shutter skew", "wobble"] },
  { tag: tag("compression", "Compression artefacts", "problem", ["macroblocks", "banding"]), objects: ["compression blocks", "banding", "mosquito noise"] },
  { tag: tag("blemishes", "Skin blemishes", "problem", ["beauty work", "spots"]), objects: ["blemishes", "tattoos", "sweat", "bruises"] },
  { tag: tag("cables", "Cables on set", "problem", ["leads", "power cables"]), objects: ["cables", "power leads", "gaffer tape"] },
  { tag: tag("footprints", "Footprints and tracks", "problem", ["tyre tracks"]), objects: ["footprints", "tyre marks", "snow tracks"] },
  { tag: tag("monitors", "Screens and monitors", "problem", ["screen inserts", "phone screens"]), objects: ["monitor glare", "phone screens", "playback screens"] },
  { tag: tag("weather", "Weather mismatch", "problem", ["rain", "snow"]), objects: ["rain", "snow", "puddles", "haze"] },
  { tag: tag("motion-blur", "Motion blur", "problem", ["smear"]), objects: ["motion blur", "smear", "double edges"] },
  { tag: tag("lens-distortion", "Lens distortion", "problem", ["undistort", "barrel"]), objects: ["lens distortion", "barrel distortion"] },
  { tag: tag("edge-fringing", "Edge fringing", "problem", ["halos", "dark edges"]), objects: ["halos", "edge fringes", "matte lines"] },
  { tag: tag("costume-fixes", "Costume fixes", "problem", ["wardrobe"]), objects: ["costume tears", "visible zips", "wardrobe tags"] },
  { tag: tag("prosthetics", "Prosthetic edges", "problem", ["makeup seams"]), objects: ["prosthetic edges", "wig lace", "makeup lines"] },
  { tag: tag("vehicles", "Modern vehicles", "problem", ["period cars"]), objects: ["modern cars", "satellite dishes", "road markings"] },
  { tag: tag("eyelines", "Eye fixes", "problem", ["eye lights"]), objects: ["eye reflections", "contact lens edges", "blinks"] },
  { tag: tag("sensor-streaks", "Sensor streaks", "problem", ["smear lines"]), objects: ["vertical streaks", "sensor smear", "clipped highlights"] },
  { tag: tag("stabilisation", "Stabilisation", "problem", ["shake", "jitter"]), objects: ["camera shake", "frame jitter", "gate weave"] },
];

const PLATES: SearchTag[] = [
  TAGS.green,
  TAGS.blue,
  TAGS.sky,
  TAGS.skin,
  TAGS.water,
  TAGS.night,
  TAGS.set,
  tag("desert", "Desert", "plate", ["sand"]),
  tag("snow-plate", "Snow", "plate", ["winter"]),
  tag("forest", "Forest", "plate", ["trees", "foliage"]),
  tag("city-street", "City street", "plate", ["street", "urban"]),
  tag("studio", "Studio", "plate", ["stage"]),
  tag("underwater", "Underwater", "plate", []),
  tag("car-interior", "Car interior", "plate", ["vehicle interior"]),
  tag("crowd", "Crowd", "plate", ["extras"]),
  tag("aerial", "Aerial", "plate", ["drone", "helicopter"]),
];

const ACTIONS = ["removal", "cleanup", "repair", "paint out", "fix", "rebuild", "suppression", "matching", "patching", "reduction"];
const METHODS = [
  "with offset frames",
  "with a clean plate",
  "by channel matrix",
  "with planar tracking",
  "with a temporal median",
  "for fast motion",
  "under motion blur",
  "in low light",
  "through smoke",
  "on moving cameras",
  "for 4K scans",
  "on anamorphic plates",
  "using a difference matte",
  "with grain restore",
  "by frame averaging",
  "with a warp",
];
const PARAM_A = "edge matte grain screen marker blur offset gain black white clip spill core detail frame patch track shadow highlight noise".split(" ");
const PARAM_B = "Size Amount Radius Level Point Limit Softness Blend Threshold Offset Strength Row".split(" ");
const SHOWS = ["SLM", "LTH", "RVN", "KTE", "OWL", "BRK", "FEN", "MOR", "TDE", "ASH", "GRV", "HLW", "QRY", "DUN", "WLD", "CRG", "PIK", "SND", "MST", "LUM"];

const cap = (s: string): string => s.charAt(0).toUpperCase() + s.slice(1);

/** `count` synthetic techniques (published and working views), deterministic for a given seed. */
export function syntheticCorpus(count: number, seed = 42): { techniqueId: string; published: SearchDocument | null; working: SearchDocument | null }[] {
  const r = rng(seed);
  const houseTaken = new Set<string>();
  const out: { techniqueId: string; published: SearchDocument | null; working: SearchDocument | null }[] = [];
  for (let i = 0; i < count; i++) {
    const problem = pick(r, PROBLEMS);
    const second = r() < 0.3 ? pick(r, PROBLEMS) : undefined;
    const plates = Array.from({ length: between(r, 0, 2) }, () => pick(r, PLATES));
    const tags = [...new Map([problem.tag, ...(second ? [second.tag] : []), ...plates].map((t) => [t.slug, t])).values()];
    const object = pick(r, problem.objects);
    const plateWords = plates.map((p) => p.name.toLowerCase());
    const context = r() < 0.5 && plates[0] ? `on ${plates[0].name.toLowerCase()}` : pick(r, METHODS);
    const tailWord = r() < 0.4 ? ` for the ${word(r)} sequence` : "";
    const title = cap(`${object} ${pick(r, ACTIONS)} ${context}${tailWord}`);
    const extra = [...object.split(" "), ...plateWords.flatMap((p) => p.split(" ")), ...context.split(" ")];
    const summary = sentence(r, extra).split(" ").slice(0, between(r, 10, 25)).join(" ");
    const aliases = Array.from({ length: between(r, 0, 3) }, () => `${pick(r, problem.objects)} ${pick(r, ACTIONS)}`);
    const parameterNames = Array.from({ length: between(r, 0, 8) }, () => pick(r, PARAM_A) + pick(r, PARAM_B));
    const shotCodes = Array.from(
      { length: between(r, 0, 12) },
      () => `${pick(r, SHOWS)}_${String(between(r, 1, 99) * 10).padStart(3, "0")}_${String(between(r, 1, 200) * 10).padStart(4, "0")}`,
    );
    // Skewed lengths: most bodies are a few paragraphs, some are long write-ups.
    const bodyWords = Math.min(600, 60 + Math.floor(-Math.log(1 - r()) * 190));
    const bodyText = paragraph(r, bodyWords, extra);
    const roll = r();
    const status: SearchStatus = roll < 0.8 ? "approved" : roll < 0.88 ? "in_review" : roll < 0.95 ? "draft" : "retired";
    const houseMethodFor = status === "approved" && !houseTaken.has(problem.tag.slug) ? [problem.tag.slug] : [];
    for (const h of houseMethodFor) houseTaken.add(h);
    const updatedAt = new Date(Date.UTC(2024, 0, 1) + Math.floor(r() * 900) * 86_400_000).toISOString();
    const techniqueId = `syn-${i}`;
    const base: SearchDocument = {
      techniqueId,
      slug: `syn-${i}-${object.replace(/\s+/g, "-")}`,
      title,
      summary,
      aliases,
      tags,
      parameterNames,
      shotCodes,
      bodyText,
      status,
      houseMethodFor,
      updatedAt,
    };
    if (status === "draft") out.push({ techniqueId, published: null, working: base });
    else if (status === "in_review") {
      out.push({
        techniqueId,
        published: { ...base, status: "approved" },
        working: { ...base, summary: `${summary} Revised.`, status: "in_review" },
      });
    } else out.push({ techniqueId, published: base, working: null });
  }
  return out;
}

/** Misspelt multi-word queries drawn from synthetic titles: a transposition, a dropped or doubled letter. */
export function syntheticQueries(corpus: ReturnType<typeof syntheticCorpus>, count: number, seed = 99): string[] {
  const r = rng(seed);
  const out: string[] = [];
  while (out.length < count) {
    const d = pick(r, corpus).published;
    if (!d) continue;
    const words = d.title.toLowerCase().split(/\s+/).filter((w) => w.length >= 4);
    if (words.length < 2) continue;
    const chosen = words.slice(0, between(r, 2, Math.min(4, words.length)));
    const k = Math.floor(r() * chosen.length);
    const w = chosen[k] as string;
    const p = between(r, 1, w.length - 2);
    const kind = r();
    chosen[k] =
      kind < 0.4 ? w.slice(0, p) + w[p + 1] + w[p] + w.slice(p + 2) : kind < 0.75 ? w.slice(0, p) + w.slice(p + 1) : w.slice(0, p) + w[p] + w.slice(p);
    if (r() < 0.3) chosen.reverse();
    out.push(chosen.join(" "));
  }
  return out;
}
