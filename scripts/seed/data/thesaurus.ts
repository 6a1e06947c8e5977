/*
 * The department's starter thesaurus: the words paint and prep people use for the same thing
 * (synonyms, searched both ways) and narrower words that should also find the broader one
 * (one way: "tracker" finds marker write-ups, "marker" does not pull in every page that says
 * "dot"). Written for Kestrel Yard from common practice of the trade, no published source; leads
 * keep it up to date on the thesaurus page. Terms are lower case; multi-word terms are phrases; a
 * term in quotes is met only by its words as written or their plurals ("cross" is a tape mark, but
 * "crossing the frame" is not; "backing" is a screen, "the back of the shot" is not).
 */

export type StarterThesaurusEntry =
  | { kind: "synonyms"; terms: string[]; note?: string }
  | { kind: "narrower"; broader: string; terms: string[]; note?: string };

const same = (terms: string[], note?: string): StarterThesaurusEntry => ({ kind: "synonyms", terms, ...(note ? { note } : {}) });
const under = (broader: string, terms: string[], note?: string): StarterThesaurusEntry => ({ kind: "narrower", broader, terms, ...(note ? { note } : {}) });

export const STARTER_THESAURUS: readonly StarterThesaurusEntry[] = [
  // ---- tracking markers ----
  under("marker", ["tracker", "tracking dot", "tracking point", "tape cross", "tape mark", "x mark", '"cross"', "dot", "ping pong ball", "witness mark"], "What gets stuck on screens and sets for the camera track."),
  same(["marker removal", "marker cleanup", "marker paint out", "tracker removal", "demarking"]),
  same(["tracking marker", "track marker", "tracking target"]),

  // ---- wires and rigs ----
  same(["wire", "cable", "stunt wire", "safety wire", "safety line", "fly wire"]),
  under("rig", ["c-stand", "stand", "rod", "pole", "clamp", "mount", "truss", "apple box", "sandbag", "armature", "pipe", "crane arm", "support"], "Anything that holds a person, prop or light in frame."),
  same(["rig removal", "support removal", "rig paint out", "rig cleanup"]),
  under("wire", ["harness", "flying rig", "kirby wire"]),

  // ---- dust, dirt, scratches ----
  under("dust", ["speck", "fleck", "sparkle", "particle", "lint", "fibre", "dirt", "muck", "hair in the gate", "gate hair"], "Specks that come and go, mostly one frame each."),
  same(["dust busting", "dust bust", "dustbust", "dust removal", "dirt removal", "despeckle"]),
  same(["scratch", "film scratch", "line scratch", "emulsion scratch", "base scratch"]),
  same(["sensor dust", "sensor spot", "sensor blob", "dust on the sensor", "dust on sensor"], "Sits in the same place on every frame from one camera."),
  under("sensor dust", ["lens dust", "dust on the lens", "smudge on the lens", "lens smudge"]),

  // ---- dead or stuck pixels ----
  same(["dead pixel", "stuck pixel", "hot pixel", "bad pixel", "pixel defect", "lit pixel"]),
  under("hot pixel", ["firefly", "white pixel", "bright pixel", "coloured pixel"]),

  // ---- boom and shadows ----
  same(["boom", "boom mic", "boom pole", "microphone", "mic", "sound boom"]),
  under("shadow", ["crew shadow", "camera shadow", "boom shadow", "equipment shadow", "cast shadow"]),

  // ---- reflections ----
  same(["reflection", "mirror image"]),
  under("reflection", ["shiny", "glossy", "chrome", "mirrored", "visor", "sunglasses", "camera reflection", "crew reflection", "reflected light", "glint"]),

  // ---- crew and people in shot ----
  under("crew", ["person", "people", "someone", "somebody", "bystander", "passer-by", "pedestrian", "onlooker", "grip", "camera operator", "crew member"], "People the story does not want in frame."),
  same(["crew removal", "people removal", "person removal"]),
  same(["background", "bg"]),
  same(["foreground", "fg"]),
  same(["vehicle", "van", "truck", "lorry", "trailer"]),

  // ---- screens ----
  same(["green screen", "greenscreen", '"green backing"', "green wall", "chroma green"]),
  same(["blue screen", "bluescreen", '"blue backing"', "blue wall", "chroma blue"]),
  under("screen", ['"backing"', "backdrop", "cyc", "cyclorama"]),
  same(["uneven screen", "patchy screen", "blotchy screen", "screen falloff", '"uneven backing"', "uneven lighting on the screen"]),
  same(["screen flattening", "screen normalising", "screen equalising", "even out the screen"]),
  same(["hot spot", "hotspot", "bright patch"]),
  same(["crease", "wrinkle", "fold"]),
  same(["screen seam", "tape seam", "tape line", "join line", "gaffer tape"]),

  // ---- grain and noise ----
  same(["regrain", "grain restore", "put grain back", "add grain back", "reapply grain", "grain restoration"], "Putting the plate's own grain back over a cleaned area."),
  same(["denoise", "degrain", "noise reduction", "grain removal", "noise removal"]),
  same(["grain", "noise"]),
  same(["grain match", "grain matching", "match the grain"]),
  under("noise", ["chatter", "boiling", "fizzing", "sizzle", "crawling"]),
  under("grain", ["plasticky", "waxy", "too smooth"]),
  same(["sensor noise", "digital noise", "iso noise", "low light noise"]),
  same(["night", "night exterior", "night ext", "nite", "after dark", "low light"]),

  // ---- logos and signage ----
  same(["logo", "brand", "branding", "trademark", "brand mark"]),
  same(["sign", "signage", "shop sign"]),
  same(["number plate", "licence plate", "license plate", "registration plate"]),
  under("signage", ["poster", "billboard", "label", "lettering", "graffiti", "writing"]),
  same(["logo removal", "debranding", "brand removal", "clearance"]),

  // ---- colour spill ----
  same(["spill", "colour spill", "screen spill", "spill light", "colour contamination"]),
  same(["despill", "spill suppression", "spill removal", "unspill"]),
  under("green spill", ["green fringe", "green edge", "green halo", "green cast"]),
  under("blue spill", ["blue fringe", "blue edge", "blue halo", "blue cast"]),

  // ---- debris ----
  under("debris", ["bird", "insect", "bug", "moth", "plane", "aircraft", "helicopter", "drone", "contrail", "litter", "rubbish", "trash", "leaf"], "Things that fly or float through a plate."),

  // ---- lens problems ----
  same(["lens distortion", "barrel distortion", "pincushion distortion", "lens warp"]),
  under("lens distortion", ["bent lines", "curved lines", "bowed lines", "fisheye", "st map", "distortion grid", "lens grid"]),
  same(["undistort", "distortion removal", "lens correction", "remove distortion"]),
  same(["vignette", "vignetting", "lens falloff", "light falloff", "corner falloff", "dark corners", "corner darkening", "lens shading"]),
  same(["chromatic aberration", "colour fringing", "purple fringing", "lateral chromatic aberration", "rgb split", "channel misalignment"]),
  same(["moire", "moire pattern", "interference pattern", "aliasing pattern", "wavy pattern"]),
  same(["lens flare", "flare", "glare"]),
  same(["defocus", "out of focus", "soft focus", "blurry", "bokeh"]),

  // ---- camera and sensor ----
  same(["rolling shutter", "shutter skew", "jello", "jelly", "wobble", "skew"]),
  under("rolling shutter", ["flash band", "flash banding", "partial flash", "half lit frame"]),
  same(["flicker", "flickering", "pulsing", "strobing", "exposure jump", "brightness jump"]),
  same(["deflicker", "flicker removal", "flicker fix"]),
  under("flicker", ["led flicker", "fluorescent flicker", "monitor flicker", "mains flicker"]),
  same(["interlacing", "interlace", "combing", "field lines"]),
  same(["compression artefact", "compression artifact", "macroblocking", "blockiness", "blocky"]),
  same(["banding", "contouring", "posterisation", "colour steps"]),
  same(["motion blur", "movement blur", "smear", "streaking"]),
  same(["handheld", "hand held", "shaky camera", "camera shake", "moving camera"]),
  same(["locked off", "lockoff", "static camera", "tripod shot", "locked camera"]),

  // ---- paint and prep operations ----
  same(["roto", "rotoscope", "rotoscoping", "roto shape"]),
  same(["paint out", "paint-out", "paintout"]),
  same(["cleanup", "clean up", "clean-up"]),
  same(["clone", "cloning", "clone brush", "clone paint"]),
  same(["patch", "clean patch", "patch fix"]),
  same(["clean plate", "clean pass", "empty plate"]),
  same(["matchmove", "match move", "camera solve", "camera track"]),
  same(["planar track", "planar tracker", "corner pin track"]),
  same(["stabilise", "stab", "steady"]),
  same(["key", "keying", "pull a key", "keyer", "chroma key"]),
  same(["matte", "mask", "alpha"]),
  same(["garbage matte", "garbage mask", "rough matte"]),
  same(["frame offset", "offset frame", "borrow from another frame", "temporal fill"]),
  under("remove", ["take out", "get rid of", "erase", "eliminate", "lose", "kill", "hide"], "Everyday ways of saying remove."),
  same(["fix", "repair", "mend"]),

  // ---- plates and surfaces ----
  same(["skin", "face", "complexion"]),
  same(["beauty work", "beauty fix", "blemish removal", "skin cleanup"]),
  under("beauty work", ["tattoo", "blemish", "pimple", "scar", "wrinkle", "bruise"]),
  under("water", ["sea", "river", "lake", "pond", "puddle", "harbour", "ocean", "waves"]),
  same(["sky replacement", "sky swap", "new sky"]),
  same(["footprints", "foot marks", "shoe prints", "tyre tracks", "tire marks"]),
  same(["smoke", "haze", "atmos", "fog", "mist"]),
  same(["hair", "flyaway hair", "fine hair", "strands", "wisps"]),
  same(["artefact", "artifact", "glitch"]),
];
