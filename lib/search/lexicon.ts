/**
 * The department's built-in lexicon of how people describe what they SEE on a plate, mapped to the
 * trade's names for the problem: "blotchy" → uneven, "shimmer" → moire, "jitter" → shake. Applied
 * one way, under the leads' thesaurus and well under the words typed (scoring.ts, "related"), so it
 * helps a "describe what you see" query reach a page that names the problem without outranking a
 * page that says the person's own words. Leads' thesaurus entries win where both cover a word.
 *
 * Written by the team from the trade's everyday vocabulary (common practice, no published source),
 * not from any query set: each row is a family of symptoms and the problem names it points at.
 * A word in quotes is met only as written or in its plural, as in the thesaurus: "crosses" are tape
 * marks, but the stemmer would also give them "crossing".
 */
export type LexiconEntry = { means: readonly string[]; seen: readonly string[] };

const row = (means: string[], seen: string[]): LexiconEntry => ({ means, seen });

export const SYMPTOM_LEXICON: readonly LexiconEntry[] = [
  // Specks and dirt that come and go.
  row(["dust", "dirt"], ["speckle", "speckles", "speckled", "specky", "grit", "fluff", "crud", "gunk", "muck", "fleck", "flecks", "specks", "blobs", "smudges", "spotty", "twinkles"]),
  // Patchy light on a backing.
  row(["uneven", "patchy"], ["blotchy", "blotches", "splotchy", "mottled", "lumpy", "inconsistent", "hotspots", "gradient"]),
  // Fine patterns that beat against the sensor.
  row(["moire", "aliasing"], ["shimmer", "shimmering", "shimmery", "ripple", "ripples", "rippling", "rainbow pattern", "zebra", "interference", "strobing pattern", "crawling pattern"]),
  row(["aliasing", "compression"], ["jaggy", "jaggies", "jagged", "staircase", "stair stepping", "stepped edges", "pixelated", "pixelation", "pixelly"]),
  // Focus and softness.
  row(["defocus", "blur"], ["soft", "fuzzy", "mushy", "unsharp", "smeary", "hazy", "dreamy", "misty", "blurred", "blurriness", "soft focus", "not sharp"]),
  // Movement blur and trails.
  row(["motion blur"], ["smeared", "smearing", "streak", "streaks", "streaky", "trails", "trailing", "ghost trail"]),
  // The camera moving when it should not.
  row(["shake", "camera shake", "stabilise"], ["jitter", "jittery", "judder", "juddering", "shaky", "shudder", "shuddering", "bouncy", "bouncing", "vibrating", "vibration", "jiggle", "jiggling", "unsteady", "handheld"]),
  row(["rolling shutter", "wobble"], ["wobbly", "wobbling", "rubbery", "squishy", "warble", "leaning verticals", "skewed", "slanted"]),
  // Brightness changing over time.
  row(["flicker"], ["flashing", "blinking", "pumping", "breathing", "fluttering", "dimming", "flickery", "strobe", "strobes", "brightness changes", "exposure changes", "light changes", "pulses", "pulsating"]),
  // Steps in smooth tones.
  row(["banding"], ["steps", "stepping", "contour lines", "contours", "posterised", "posterized", "rings in the sky", "bands"]),
  row(["compression", "macroblocking"], ["blocks", "squares", "square blocks", "mosquito noise", "artefacting", "artifacting", "low bitrate", "crunchy"]),
  // Colour around edges.
  row(["chromatic aberration", "fringing"], ["fringe", "fringes", "fringed", "colour edges", "colored edges", "coloured edges", "rainbow edges", "colour bleed", "colour halo", "magenta edge", "cyan edge"]),
  row(["spill"], ["halo", "halos", "haloing", "glow around", "colour cast", "tint on the edges", "contamination"]),
  // Dark or bent edges of frame.
  row(["vignetting"], ["darker edges", "dark edges", "dark border", "shaded corners", "tunnel", "tunnel vision", "vignetted"]),
  row(["lens distortion"], ["bulge", "bulging", "bulgy", "stretched", "warped", "warping", "curved", "curving", "bowed", "bowing", "fish eye", "pincushion", "barrel"]),
  // Light sources seen through the lens.
  row(["lens flare", "ghost"], ["starburst", "sunburst", "light streak", "light streaks", "orbs", "orb", "hexagons", "hexagon", "rings of light", "sun glare", "sun flare", "veiling glare"]),
  // Sensor faults.
  row(["hot pixel", "dead pixel"], ["stuck dot", "bright dot", "white dot", "sparkly pixel", "twinkling pixel", "firefly", "fireflies"]),
  // Things that hold people, props and lights.
  row(["wire"], ["string", "strings", "thread", "cord", "rope", "fishing line", "monofilament", "mono", "tether", "cable rig"]),
  row(["rig", "crane"], ["tripod", "ladder", "scaffold", "scaffolding", "bracket", "jib", "technocrane", "gantry", "bar", "brace", "support arm", "lighting stand", "sandbags", "flag", "frame rig"]),
  row(["crash mat", "pad"], ["cushion", "cushions", "padding", "airbag", "crash pad", "stunt box", "boxes", "landing pad"]),
  // People and their things.
  row(["crew", "people"], ["man", "woman", "guy", "guys", "bloke", "lady", "girl", "boy", "kid", "child", "figure", "extra", "extras", "crowd", "public", "member of the public", "jogger", "cyclist", "dog walker", "spectator", "spectators", "visitor", "visitors", "walker", "stranger", "strangers"]),
  row(["shadow"], ["shade", "shaded", "dark shape", "dark patch", "shadowy"]),
  row(["reflection"], ["reflected", "reflects", "reflecting", "mirror", "glass", "shiny surface", "polished", "gloss", "sheen on the car"]),
  row(["marker"], ["sticker", "stickers", "target", "targets", '"crosses"', "tape", "ping pong balls", "golf balls", "reference points"]),
  row(["shine", "sweat"], ["sheen", "oily", "greasy", "glistening", "glossy skin", "hotspot on skin", "perspiration"]),
  row(["beauty work", "blemish"], ["zit", "zits", "acne", "pimples", "mole", "moles", "freckle", "spots on skin", "redness", "eye bags", "veins", "stubble rash"]),
  row(["earpiece", "radio mic"], ["earbud", "earphone", "earpiece wire", "mic pack", "lav", "lavalier", "lapel mic", "transmitter", "battery pack"]),
  row(["logo", "brand"], ["brand name", "badge", "emblem", "swoosh", "print on the shirt", "name tag", "label"]),
  row(["debris", "bird", "insect"], ["gnat", "gnats", "midge", "midges", "mosquito", "wasp", "bee", "bees", "pigeon", "pigeons", "seagull", "gull", "gulls", "crow", "crows", "kite", "balloon", "plastic bag", "leaves", "feathers"]),
  row(["dropped frames", "duplicate frames"], ["stutter", "stuttering", "skip", "skipping", "hiccup", "jump cut", "repeated frame", "missing frame", "frozen frame", "glitchy"]),
  row(["light leak", "flash frame"], ["fogged", "fogging", "burn", "burnt frames", "whiteout", "white frame", "overexposed frame", "roll end", "end of roll"]),
  row(["sky replacement", "sky"], ["blown out sky", "burnt out sky", "white sky", "grey sky", "gray sky", "overcast", "clipped sky", "boring sky"]),
  row(["rain"], ["drizzle", "downpour", "raindrops", "rain drops", "wet weather", "rainfall"]),
  row(["noise", "grain"], ["noisy", "grainy", "salt and pepper", "static", "fizz", "speckly", "clumpy grain", "sparkle noise"]),
];
