/**
 * Look-alike techniques and junior queries for the search quality set (issue 6, "Quality").
 * Written for Plateroom; the trade facts are common practice, no published source. The benchmark
 * (bench/search.ts) embeds the same corpus in large synthetic ones, so keep this file free of vitest.
 */
import type { SearchDocument, SearchTag } from "@/lib/search/types";

const tag = (slug: string, name: string, kind: SearchTag["kind"], aliases: string[]): SearchTag => ({ slug, name, kind, aliases });

export const TAGS = {
  markers: tag("tracking-markers", "Tracking markers", "problem", ["tracker dots", "tracking dots", "track markers", "markers", "crosses"]),
  wire: tag("wire-rig", "Wire or rig", "problem", ["wires", "rig removal", "harness", "safety cable"]),
  dust: tag("dust-scratches", "Dust and scratches", "problem", ["dust busting", "film dirt", "sparkles", "scratches"]),
  deadPixels: tag("dead-pixels", "Dead or stuck pixels", "problem", ["hot pixels", "stuck pixel", "sensor defects"]),
  boom: tag("boom-shadow", "Boom or shadow", "problem", ["boom mic", "crew shadow", "shadows"]),
  reflections: tag("reflections", "Reflections", "problem", ["crew reflection", "camera reflection"]),
  crew: tag("crew-in-shot", "Crew in shot", "problem", ["crew member", "people in background"]),
  uneven: tag("uneven-screen", "Uneven screen", "problem", ["screen flattening", "patchy backing", "hotspots"]),
  grain: tag("grain-noise", "Grain and noise", "problem", ["regrain", "film grain", "noise", "denoise"]),
  logos: tag("logos-signage", "Logos and signage", "problem", ["brand removal", "de-branding", "sign replacement", "logo"]),
  spill: tag("colour-spill", "Colour spill", "problem", ["green spill", "blue spill", "despill", "color spill"]),
  seams: tag("screen-seams", "Screen seams", "problem", ["tape lines", "creases", "folds"]),
  debris: tag("debris", "Debris and birds", "problem", ["birds", "aircraft", "floating debris"]),
  green: tag("green-screen", "Green screen", "plate", ["greenscreen", "green backing", "chroma green"]),
  blue: tag("blue-screen", "Blue screen", "plate", ["bluescreen", "blue backing"]),
  sky: tag("sky", "Sky", "plate", ["skies", "clouds"]),
  skin: tag("skin", "Skin", "plate", ["face", "beauty"]),
  water: tag("water", "Water", "plate", ["sea", "river", "pool"]),
  night: tag("night-exterior", "Night exterior", "plate", ["night ext", "low light"]),
  set: tag("set-surfaces", "Set surfaces", "plate", ["walls", "floor", "set"]),
};

type Partial = Pick<SearchDocument, "slug" | "title" | "summary" | "bodyText"> &
  Partial2<Pick<SearchDocument, "aliases" | "tags" | "parameterNames" | "shotCodes" | "status" | "houseMethodFor" | "updatedAt">>;
type Partial2<T> = { [K in keyof T]?: T[K] };

let counter = 0;
function technique(p: Partial): SearchDocument {
  counter++;
  return {
    techniqueId: `fx-${String(counter).padStart(3, "0")}`,
    aliases: [],
    tags: [],
    parameterNames: [],
    shotCodes: [],
    status: "approved",
    houseMethodFor: [],
    updatedAt: `2026-0${1 + (counter % 9)}-1${counter % 10}T10:00:00.000Z`,
    ...p,
  };
}

export const FIXTURE_DOCS: SearchDocument[] = [
  technique({
    slug: "markers-blue-screen-matrix",
    title: "Marker removal on blue screen with a channel matrix",
    summary: "Hide tracking markers on a blue backing by rebuilding the channel where they differ from the screen.",
    aliases: ["blue screen marker cleanup", "remove tracking crosses on blue"],
    tags: [TAGS.markers, TAGS.blue],
    parameterNames: ["markerRow", "screenLevel", "matteSoftness"],
    shotCodes: ["SLM_040_0120", "SLM_040_0130"],
    bodyText:
      "Markers on a blue screen are usually a lighter or greener blue than the backing. Sample the markers and the screen, solve a matrix row for the blue channel so both land on the same value, then key the rebuilt plate. Works when the markers are a single hue; fails when the talent crosses a marker, so garbage-matte the actor out first. Keep the original plate outside the screen area with a mix through matte.",
  }),
  technique({
    slug: "markers-green-screen-matrix",
    title: "Tracking marker removal on green screen",
    summary: "The department's standard way to clear tracking markers from a green backing before keying.",
    aliases: ["green screen tracker cleanup"],
    tags: [TAGS.markers, TAGS.green],
    parameterNames: ["markerRow", "screenLevel"],
    shotCodes: ["SLM_050_0010", "LTH_102_0040"],
    houseMethodFor: ["tracking-markers"],
    bodyText:
      "Green screen markers are often pink or magenta tape crosses. Copy the green channel into the channel where the marker shows, or solve a matrix row that matches the markers to the screen, then restore grain. Check the edges of hair: the cleaned channel must not change the foreground. Caution: markers under motion blur smear and need a wider matte.",
  }),
  technique({
    slug: "markers-on-set-patch",
    title: "Painting out tracking markers on walls and floors",
    summary: "Patch markers stuck on real set surfaces with a tracked clean patch instead of a channel trick.",
    aliases: ["marker paint out on set"],
    tags: [TAGS.markers, TAGS.set],
    parameterNames: ["patchSize", "featherRadius"],
    bodyText:
      "When markers sit on a textured wall, floor or prop there is no flat screen colour to match. Track the surface with a planar track, paint a clean patch on one frame, and reapply it through the track. Regrain the patch so it does not swim.",
  }),
  technique({
    slug: "dots-on-skin",
    title: "Removing tracking dots from faces",
    summary: "Clean small dots applied to an actor's face for facial tracking without smearing pores.",
    aliases: ["face dot removal", "beauty dot cleanup"],
    tags: [TAGS.markers, TAGS.skin],
    parameterNames: ["cloneOffset", "textureBlend"],
    bodyText:
      "Facial dots move with the skin, so a still patch will slide. Use a local warp or a short-offset clone from neighbouring skin, keep the pore texture, and check the result at full resolution. Colour-match the skin tone under changing light.",
  }),
  technique({
    slug: "wire-removal-sky",
    title: "Wire removal against sky",
    summary: "Take out thin stunt wires over sky or soft backgrounds using frame offsets and a blur fill.",
    aliases: ["sky wire cleanup", "remove stunt wires"],
    tags: [TAGS.wire, TAGS.sky],
    parameterNames: ["frameOffset", "fillBlur"],
    shotCodes: ["LTH_101_0230"],
    houseMethodFor: ["wire-rig"],
    bodyText:
      "Over a smooth sky a wire can be filled from either side: roto a thin shape along the wire, blur the surrounding sky into it or borrow pixels from a frame where the wire has moved. Add grain back so the fill matches. Fails when clouds move fast behind the wire.",
  }),
  technique({
    slug: "rig-removal-clean-plate",
    title: "Rig removal with a clean plate",
    summary: "Replace large rigs, stands and cranes using a clean pass shot without them.",
    aliases: ["crane removal", "stand removal"],
    tags: [TAGS.wire, TAGS.set],
    parameterNames: ["alignTrack", "edgeFeather"],
    bodyText:
      "Big rigs cannot be filled from nearby pixels. Line up the clean plate with the main plate using a track, match the lighting with a colour matrix, and mix it in through a roto matte around the rig. If no clean plate was shot, build one from several frames.",
  }),
  technique({
    slug: "wire-removal-busy-background",
    title: "Wire removal over detailed backgrounds",
    summary: "Remove harness wires crossing foliage or buildings, where a blur fill would show.",
    aliases: ["harness wire removal"],
    tags: [TAGS.wire],
    parameterNames: ["cloneSource", "frameOffset"],
    bodyText:
      "Detailed backgrounds show any smear. Clone from an offset frame after stabilising the background, or rebuild the area from a tracked patch. Keep the wire's motion blur out of the patch edge.",
  }),
  technique({
    slug: "dust-busting-film",
    title: "Dust busting scanned film",
    summary: "Remove dust, dirt and sparkles that appear on single frames of a film scan.",
    aliases: ["film dust removal", "dirt cleanup"],
    tags: [TAGS.dust],
    parameterNames: ["medianFrames", "threshold"],
    bodyText:
      "Dust appears on one frame only, so a temporal median of the frames before and after replaces it. Limit the fix to the detected specks with a threshold matte so moving detail is not softened. Sparkles are white dust on the negative; dark specks are dirt on the positive.",
  }),
  technique({
    slug: "dead-pixel-repair",
    title: "Dead and stuck pixel repair",
    summary: "Fix sensor pixels that stay black, white or one colour in the same place on every frame.",
    aliases: ["hot pixel fix", "pixel map repair"],
    tags: [TAGS.deadPixels],
    parameterNames: ["pixelMap", "fillRadius"],
    bodyText:
      "A dead or stuck pixel sits at the same position for the whole shot, unlike dust. Make a pixel map from a frame where it is visible and fill each position from its neighbours with a small median. Check night shots, where hot pixels show most.",
  }),
  technique({
    slug: "vertical-scratch-repair",
    title: "Vertical scratch repair on film scans",
    summary: "Remove long vertical lines scratched into the film that stay for many frames.",
    aliases: ["line scratch removal"],
    tags: [TAGS.dust],
    parameterNames: ["scratchWidth", "sideSample"],
    bodyText:
      "A scratch runs down the frame and persists, so temporal medians do not help. Fill the thin column from the pixels on both sides and regrain it. Watch for scratches that wander across the frame.",
  }),
  technique({
    slug: "grain-matching-patches",
    title: "Grain matching for paint patches",
    summary: "Make painted or cloned areas carry the same grain as the plate around them.",
    aliases: ["regrain paint work"],
    tags: [TAGS.grain],
    parameterNames: ["grainAmount", "grainSize"],
    bodyText:
      "Painted fixes look smooth and flat. Take the plate's own grain as plate minus denoised plate and add it back over the patch, or match a grain sample per channel. Compare the blue channel, where grain is strongest.",
  }),
  technique({
    slug: "denoise-before-keying",
    title: "Plate denoise with grain restore",
    summary: "Denoise a plate to pull a clean key, then put the original grain back on the result.",
    aliases: ["denoise and regrain", "noise reduction for keys"],
    tags: [TAGS.grain, TAGS.green],
    parameterNames: ["denoiseStrength", "restoreGrain"],
    houseMethodFor: ["grain-noise"],
    bodyText:
      "Noise chatters along matte edges. Denoise the plate before keying, key the denoised plate, and after the cleanup add back the difference between the original and the denoised plate so the grain is untouched.",
  }),
  technique({
    slug: "night-exterior-noise",
    title: "Cleaning noisy night exteriors",
    summary: "Reduce heavy sensor noise in dark night plates without losing shadow detail.",
    aliases: ["low light noise cleanup"],
    tags: [TAGS.grain, TAGS.night],
    parameterNames: ["shadowProtect", "denoiseStrength"],
    bodyText:
      "Night plates shot at high sensitivity carry coloured noise in the shadows. Denoise the chroma more than the luminance, protect the darkest areas, and compare against the original at 200 percent.",
  }),
  technique({
    slug: "screen-flattening",
    title: "Screen flattening by normalised blur",
    summary: "Even out a patchy backing screen before keying by dividing by an estimate of the clean screen.",
    aliases: ["even out backing"],
    tags: [TAGS.uneven, TAGS.green, TAGS.blue],
    parameterNames: ["screenMask", "blurSize", "targetColour"],
    houseMethodFor: ["uneven-screen"],
    bodyText:
      "Uneven lighting makes a screen brighter in the middle and darker at the edges. Blur the plate times a screen mask, divide by the blurred mask to estimate the clean screen, divide the plate by that estimate and multiply by one target colour. The key then needs one setting for the whole frame.",
  }),
  technique({
    slug: "spill-suppression-green",
    title: "Spill suppression on green screen edges",
    summary: "Remove the green cast that the screen throws onto hair, skin and costume edges.",
    aliases: ["green despill"],
    tags: [TAGS.spill, TAGS.green],
    parameterNames: ["spillLimit", "replaceColour"],
    bodyText:
      "Limit green to the average of red and blue where it exceeds it, only inside an edge matte. Replace the removed spill with the background's colour so edges do not go grey.",
  }),
  technique({
    slug: "blue-spill-hair",
    title: "Blue spill removal on hair and fine detail",
    summary: "Suppress blue screen spill in fine hair without killing blue costumes.",
    aliases: ["blue despill for hair"],
    tags: [TAGS.spill, TAGS.blue, TAGS.skin],
    parameterNames: ["spillLimit", "hairMatte"],
    bodyText:
      "Blue spill sits in the fine hair strands. Hold out costume areas with a matte, then limit blue against green in the hair only, and colour-correct the strands back to a natural tone.",
  }),
  technique({
    slug: "tape-seams-on-screens",
    title: "Removing tape seams and creases on backing screens",
    summary: "Paint out tape lines, seams and folds on a backing so the key holds.",
    aliases: ["screen seam cleanup"],
    tags: [TAGS.seams, TAGS.green, TAGS.blue],
    parameterNames: ["seamWidth"],
    bodyText:
      "Tape and fabric seams show as lines of a different shade. Track them, fill the line from the screen on both sides and check that the flattened screen stays even.",
  }),
  technique({
    slug: "boom-mic-removal",
    title: "Boom mic removal at frame top",
    summary: "Clear a microphone boom that dips into the top of frame.",
    aliases: ["remove boom"],
    tags: [TAGS.boom],
    parameterNames: ["patchTrack"],
    bodyText:
      "The boom dips into the top edge for a few frames. Borrow the area from frames where it is out of shot, or extend the set upward with a tracked patch.",
  }),
  technique({
    slug: "crew-shadow-removal",
    title: "Crew shadow removal on floors",
    summary: "Take out shadows that crew or equipment cast on the floor or walls.",
    aliases: ["remove crew shadows"],
    tags: [TAGS.boom, TAGS.set],
    parameterNames: ["shadowMatte", "gainMatch"],
    bodyText:
      "A shadow darkens the floor but keeps its texture. Matte the shadow, raise the gain inside it to match the lit floor, and soften the matte to the shadow's own penumbra.",
  }),
  technique({
    slug: "reflection-removal",
    title: "Crew reflection removal in glass and car bodywork",
    summary: "Remove the camera and crew reflected in windows, mirrors and shiny cars.",
    aliases: ["camera reflection cleanup"],
    tags: [TAGS.reflections],
    parameterNames: ["reflectionMatte"],
    bodyText:
      "Reflections move differently from the surface. Track the surface, build a clean reflection from other frames or paint it, and keep the specular highlights of the glass or car window.",
  }),
  technique({
    slug: "logo-removal",
    title: "Logo and signage removal on moving surfaces",
    summary: "Remove brand logos and shop signs that legal clearance asks to take out.",
    aliases: ["brand cleanup", "sign removal"],
    tags: [TAGS.logos],
    parameterNames: ["planarTrack", "patchBlend"],
    bodyText:
      "Logos on shirts, cars and shop fronts must go when they are not cleared. Track with a planar track, paint one clean frame and reapply it, matching lighting changes with a gain.",
  }),
  technique({
    slug: "sky-debris-birds",
    title: "Removing birds and aircraft from skies",
    summary: "Clean birds, planes and contrails crossing an otherwise clear sky.",
    aliases: ["bird removal", "plane removal"],
    tags: [TAGS.debris, TAGS.sky],
    parameterNames: ["frameOffset"],
    bodyText: "Birds cross quickly; take sky from a nearby frame and blend. Contrails need a soft fill along their length.",
  }),
  technique({
    slug: "water-debris",
    title: "Cleaning floating debris on water surfaces",
    summary: "Remove rubbish and debris floating on sea, river or pool surfaces.",
    aliases: ["water surface cleanup"],
    tags: [TAGS.debris, TAGS.water],
    parameterNames: ["flowOffset"],
    bodyText:
      "Water never repeats, so patches must move with the flow. Use offset frames along the current and blend the edges, then regrain.",
  }),
  technique({
    slug: "crew-in-background",
    title: "Removing crew members from the background",
    summary: "Paint out crew and bystanders visible in the background of a shot.",
    aliases: ["bystander removal"],
    tags: [TAGS.crew],
    parameterNames: ["cleanPlateBlend"],
    bodyText: "Build the background from frames where the person has moved or from a clean plate, and roto any foreground that crosses them.",
  }),
];

export type QualityQuery = { query: string; expected: string; reason: string };

/** Junior queries: each must put `expected` in the top 3 (issue 6). */
export const QUALITY_QUERIES: QualityQuery[] = [
  { query: "trakcing markrs blu screen", expected: "markers-blue-screen-matrix", reason: "two transpositions/dropped letters and a partial word" },
  { query: "tracker dots green screen", expected: "markers-green-screen-matrix", reason: "trade synonym via the tag alias 'tracker dots'" },
  { query: "blue screen markers remove", expected: "markers-blue-screen-matrix", reason: "word order reversed against the title" },
  { query: "trackng marker grean screen", expected: "markers-green-screen-matrix", reason: "two misspellings; 'grean' could also be 'green' or 'screen'" },
  { query: "dots on actors face", expected: "dots-on-skin", reason: "own words; 'face' is the skin tag alias, dots the marker alias" },
  { query: "markers on wall", expected: "markers-on-set-patch", reason: "set surface, not a screen" },
  { query: "wire remvoal sky", expected: "wire-removal-sky", reason: "transposition in 'removal'" },
  { query: "rig removel clean plate", expected: "rig-removal-clean-plate", reason: "misspelt 'removal' against look-alike wire techniques" },
  { query: "crane in shot", expected: "rig-removal-clean-plate", reason: "the rig named by kind, in an alias" },
  { query: "harness wire in trees", expected: "wire-removal-busy-background", reason: "'harness' alias plus busy background" },
  { query: "dust bustng", expected: "dust-busting-film", reason: "dropped letter" },
  { query: "dead pixles", expected: "dead-pixel-repair", reason: "transposition; look-alike is dust busting" },
  { query: "pixel stuck same place every frame", expected: "dead-pixel-repair", reason: "description in own words, word order changed" },
  { query: "hot pixels night", expected: "dead-pixel-repair", reason: "tag alias 'hot pixels'; night noise is the look-alike" },
  { query: "film dirt sparkles", expected: "dust-busting-film", reason: "trade terms in the tag aliases" },
  { query: "vertical scratch line", expected: "vertical-scratch-repair", reason: "scratch vs dust look-alike" },
  { query: "regrain patch", expected: "grain-matching-patches", reason: "trade word 'regrain' is an alias of grain and noise" },
  { query: "grain matchng paint", expected: "grain-matching-patches", reason: "dropped letter; denoise is the look-alike" },
  { query: "denoise befor key", expected: "denoise-before-keying", reason: "dropped letter and partial word 'key'" },
  { query: "noisy night plate", expected: "night-exterior-noise", reason: "'noisy' against 'noise', 'night' against the plate tag" },
  { query: "uneven blue screen", expected: "screen-flattening", reason: "problem tag name; blue screen markers is the look-alike" },
  { query: "screen flatening", expected: "screen-flattening", reason: "dropped letter" },
  { query: "green spil on edges", expected: "spill-suppression-green", reason: "dropped letter; blue spill is the look-alike" },
  { query: "despill hair blue", expected: "blue-spill-hair", reason: "alias 'despill'; green spill is the look-alike" },
  { query: "tape lines greenscreen", expected: "tape-seams-on-screens", reason: "tag aliases, run-together 'greenscreen'" },
  { query: "boom mic top of frame", expected: "boom-mic-removal", reason: "crew shadow shares the boom tag" },
  { query: "shadow of crew on floor", expected: "crew-shadow-removal", reason: "word order; crew in background is the look-alike" },
  { query: "reflection in car window", expected: "reflection-removal", reason: "words only in summary and body" },
  { query: "logo remov", expected: "logo-removal", reason: "partial word typed mid-way" },
  { query: "brand remval", expected: "logo-removal", reason: "alias 'brand removal' with a dropped letter" },
  { query: "birds in sky", expected: "sky-debris-birds", reason: "wire against sky is the look-alike" },
  { query: "rubish floating in the river", expected: "water-debris", reason: "misspelt 'rubbish', 'river' is a water tag alias" },
  { query: "bluescreen trakers", expected: "markers-blue-screen-matrix", reason: "run-together word plus misspelt 'trackers'" },
  { query: "remove people in backround", expected: "crew-in-background", reason: "'people in background' alias, dropped letter" },
  // Written afterwards as a held-out check (not tuned against); "flaten screen" failed at first and
  // led to comparing stems in typo correction.
  { query: "how do i get rid of tracking markers on bluescreen", expected: "markers-blue-screen-matrix", reason: "long own-words question with a run-together word" },
  { query: "green screen crosses", expected: "markers-green-screen-matrix", reason: "'crosses' only as a tag alias and in the body" },
  { query: "painting markers off the floor", expected: "markers-on-set-patch", reason: "'floor' is a set surface alias" },
  { query: "remove stand from shot clean plate", expected: "rig-removal-clean-plate", reason: "stand is an alias; wire techniques look alike" },
  { query: "scratches on film running down", expected: "vertical-scratch-repair", reason: "dust busting shares the film scratches tag" },
  { query: "white specks single frame", expected: "dust-busting-film", reason: "described, not named" },
  { query: "pixel always same position", expected: "dead-pixel-repair", reason: "described, not named" },
  { query: "grain on paint fix looks smooth", expected: "grain-matching-patches", reason: "symptom in own words" },
  { query: "key chatter noise", expected: "denoise-before-keying", reason: "'chatter' only in the body" },
  { query: "patchy backing", expected: "screen-flattening", reason: "tag alias of uneven screen" },
  { query: "greenscreen spill on skin", expected: "spill-suppression-green", reason: "run-together word; blue spill on hair and skin looks alike" },
  { query: "mic in top of frame", expected: "boom-mic-removal", reason: "short form of 'microphone'/'boom mic'" },
  { query: "reflection of camera in mirror", expected: "reflection-removal", reason: "words from alias and summary" },
  { query: "signs on shop fronts", expected: "logo-removal", reason: "'signs' against 'signage' and 'sign removal'" },
  { query: "plane in sky", expected: "sky-debris-birds", reason: "wire against sky looks alike" },
  { query: "stuff floating on water", expected: "water-debris", reason: "vague own words" },
  { query: "people walking in background", expected: "crew-in-background", reason: "tag alias 'people in background'" },
  { query: "face tracking dots", expected: "dots-on-skin", reason: "against the marker techniques on screens" },
  { query: "darker floor shadow", expected: "crew-shadow-removal", reason: "symptom words" },
  { query: "denoise night shot", expected: "night-exterior-noise", reason: "the house denoise method looks alike" },
  { query: "seams in blue screen", expected: "tape-seams-on-screens", reason: "blue screen markers look alike" },
  { query: "blue spil in hair", expected: "blue-spill-hair", reason: "dropped letter" },
  { query: "tracking markrs on green", expected: "markers-green-screen-matrix", reason: "dropped letter, plate named by colour only" },
  { query: "deadpixel", expected: "dead-pixel-repair", reason: "run-together words" },
  { query: "flaten screen", expected: "screen-flattening", reason: "dropped letter in a word the corpus only has as 'flattening'" },
];
