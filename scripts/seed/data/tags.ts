/*
 * Problem tags (what is wrong in the plate) and plate tags (what the plate is). Aliases are the
 * words juniors actually type, so search can land them on the right tag. Slugs are the names,
 * lowercase and hyphenated.
 */

type DemoTagKind = "problem" | "plate";
type DemoTag = { kind: DemoTagKind; name: string; slug: string; description: string; aliases: string[] };

export const DEMO_TAGS: readonly DemoTag[] = [
  // ---- problem tags ----
  {
    kind: "problem",
    name: "Tracking markers",
    slug: "tracking-markers",
    description: "Tape crosses, dots and other camera-tracking targets stuck on screens, walls or set pieces that must not survive into the comp.",
    aliases: ["tracker dots", "track markers", "tape crosses", "markers", "tracking dots", "tracking crosses", "trackers", "x marks"],
  },
  {
    kind: "problem",
    name: "Wire or rig",
    slug: "wire-or-rig",
    description: "Safety wires, stunt cables, rods, stands and rigging that hold people or props in frame.",
    aliases: ["wire removal", "wires", "cable", "stunt wire", "safety line", "rig removal", "rod", "stand", "harness"],
  },
  {
    kind: "problem",
    name: "Dust and scratches",
    slug: "dust-and-scratches",
    description: "Specks and lines from scanned film or from dust on a digital sensor, single-frame or persistent.",
    aliases: ["dust", "dust busting", "dustbust", "sensor dust", "film dirt", "hairs", "scratch", "specks", "sparkle"],
  },
  {
    kind: "problem",
    name: "Dead or stuck pixels",
    slug: "dead-or-stuck-pixels",
    description: "Sensor photosites that stay black, stay bright or stick in one channel in every frame from one camera.",
    aliases: ["hot pixels", "stuck pixels", "dead pixels", "bright pixel", "lit pixel", "sensor defect", "pixel defect", "firefly"],
  },
  {
    kind: "problem",
    name: "Boom or shadow",
    slug: "boom-or-shadow",
    description: "A sound boom, its shadow, or the shadow of crew or equipment falling across the set.",
    aliases: ["boom in shot", "boom shadow", "mic shadow", "microphone", "crew shadow", "unwanted shadow", "shadow removal"],
  },
  {
    kind: "problem",
    name: "Reflections",
    slug: "reflections",
    description: "Crew, camera or lights reflected in glass, water, chrome, eyes or other shiny surfaces.",
    aliases: ["reflection removal", "camera reflection", "crew reflection", "glass reflection", "window reflection", "reflected light", "mirror"],
  },
  {
    kind: "problem",
    name: "Crew in shot",
    slug: "crew-in-shot",
    description: "Crew members, equipment or vehicles visible in frame that the story does not want.",
    aliases: ["crew removal", "people removal", "person in background", "equipment in shot", "van in shot", "remove person"],
  },
  {
    kind: "problem",
    name: "Uneven screen",
    slug: "uneven-screen",
    description: "A green or blue backing that varies in brightness or colour across the frame, making a clean key hard.",
    aliases: ["patchy screen", "screen falloff", "uneven green", "uneven blue", "hot spot", "screen gradient", "creases in screen", "screen flattening", "bad screen"],
  },
  {
    kind: "problem",
    name: "Grain and noise",
    slug: "grain-and-noise",
    description: "Film grain or sensor noise that must be removed for the work and put back, matched, on the result.",
    aliases: ["grain", "noise", "regrain", "degrain", "denoise", "grain match", "grain restore", "noisy plate", "grain mismatch"],
  },
  {
    kind: "problem",
    name: "Logos and signage",
    slug: "logos-and-signage",
    description: "Brand marks, shop signs, posters, plates and printed text that must be removed or replaced for clearance.",
    aliases: ["logo removal", "branding", "brand", "sign", "signage", "number plate", "license plate", "poster", "clearance"],
  },
  // ---- plate tags ----
  {
    kind: "plate",
    name: "Green screen",
    slug: "green-screen",
    description: "Shot against a green backing for keying.",
    aliases: ["greenscreen", "green backing", "gs", "chroma green", "green wall"],
  },
  {
    kind: "plate",
    name: "Blue screen",
    slug: "blue-screen",
    description: "Shot against a blue backing for keying.",
    aliases: ["bluescreen", "blue backing", "bs", "chroma blue", "blue wall"],
  },
  {
    kind: "plate",
    name: "Sky",
    slug: "sky",
    description: "Open sky fills a large part of the frame, where every speck and wire shows.",
    aliases: ["skies", "sky plate", "clouds", "overcast", "sky replacement"],
  },
  {
    kind: "plate",
    name: "Skin",
    slug: "skin",
    description: "Close work on faces, hands or bodies where texture and colour must stay untouched.",
    aliases: ["face", "faces", "close-up", "beauty", "skin texture", "hands"],
  },
  {
    kind: "plate",
    name: "Water",
    slug: "water",
    description: "Moving water, ice or wet surfaces that reflect and never hold still.",
    aliases: ["sea", "harbour", "harbor", "river", "marsh water", "ice", "wet ground", "puddle"],
  },
  {
    kind: "plate",
    name: "Night exterior",
    slug: "night-exterior",
    description: "Exterior shot at night, low light, where noise is heavy and defects stand out in the blacks.",
    aliases: ["night ext", "night shoot", "low light", "dark plate", "nite ext", "night"],
  },
];
