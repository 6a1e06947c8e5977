import type { BlockNode, TechniqueDocument } from "@/lib/techniques/document";
import { b, caution, codeBlock, doc, fails, h2, h3, i, link, ol, p, table, ul, works } from "@/scripts/seed/data/doc";

/*
 * Demo techniques for Kestrel Yard's paint and prep department. Invented write-ups in our own
 * words from common trade practice; no show, studio, person or product is real. Each `key`
 * equals slugify(title), so the seed can use it as the technique's slug.
 */

export type DemoLifecycle = "approved" | "in-review-edit" | "draft" | "in-review" | "retired-superseded";
type DemoUseOutcome = "clean" | "touch-up" | "failed";
type DemoUse = { shot: string; outcome: DemoUseOutcome; note: string; by: string };
/** A revision made after approval that waits for review (lifecycle "in-review-edit"). */
type DemoEdit = { summary?: string; bodyAppend: BlockNode[]; changeNote: string };

export type DemoTechnique = {
  key: string;
  title: string;
  summary: string;
  aliases: string[];
  /** Tag slugs from DEMO_TAGS, problem and plate alike. */
  tags: string[];
  body: TechniqueDocument;
  /** E-mail of a senior or lead in DEMO_PEOPLE. */
  author: string;
  lifecycle: DemoLifecycle;
  /** Only with lifecycle "in-review-edit". */
  edit?: DemoEdit;
  /** Only with lifecycle "retired-superseded": key of the technique that replaces it. */
  supersededBy?: string;
  /** Problem tag slug this is the department's approved method for. */
  houseMethodFor?: string;
  uses?: DemoUse[];
};

// ---------------------------------------------------------------------------------------------
// Tracking markers: the house method
// ---------------------------------------------------------------------------------------------

const markerChannelCleanup: DemoTechnique = {
  key: "marker-channel-cleanup",
  title: "Marker channel cleanup",
  summary:
    "Make screen markers vanish in one channel with a 3×3 colour matrix, rebuild the other channels from it, and mix the result back only through a marker matte.",
  aliases: [
    "remove tracking markers",
    "marker removal on green screen",
    "marker removal on blue screen",
    "tape cross removal",
    "tracker dot cleanup",
    "channel swap marker fix",
    "matrix marker removal",
  ],
  tags: ["tracking-markers", "green-screen", "blue-screen"],
  author: "senior@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "tracking-markers",
  body: doc(
    h2("Recognising the problem"),
    p(
      "Tape crosses, dots or squares of a second screen cloth, differing from the backing more in **hue** than in brightness: pink or yellow on green, yellow or orange on blue. If the screen around them is fairly even and nothing in the foreground shares the marker colour, this cleans the whole shot at once, with no tracking and no paint.",
    ),
    h2("Why it works"),
    p(
      "In linear light every pixel on a marked screen is a blend of two colours, screen and marker; soft edges and motion blur only change the proportion. A colour matrix is linear, so if one output channel gives marker and screen the ",
      i("same"),
      " value, it gives every blend between them that value too: the markers vanish from that channel, edges included.",
    ),
    h2("Steps"),
    ol(
      "**Linearise and denoise.** Work on a denoised, scene-linear copy. Keep the original for the grain.",
      "**Sample** three to nine boxes inside the flat cores of markers (never on edges) and as many on the screen right beside them. Sample every marker colour.",
      "**Hide the markers in the cleanest channel,** usually the screen's own. Let the lab's solver find the smallest change to that channel's matrix row that makes marker and screen equal, and read the residual per marker shade.",
      "**Level match** the new channel to the original one over a marker-free band of screen (gain and offset).",
      "**Copy it into the other two channels,** each with a gain-and-offset level match against that channel of the plate. The screen is now clean, but the foreground has lost its colour.",
      "**Pull a marker matte** with a second matrix row that maps marker to 1 and screen to 0.",
      "**Grow and soften** the matte to cover the soft edge and motion blur.",
      "**Mix** the rebuilt image over the plate through the matte only.",
      "**Restore the grain:** add back the plate minus the denoised plate.",
    ),
    h3("The recipe, written out"),
    p("Example from a green screen with pink crosses. Solve your own."),
    codeBlock(
      [
        "matrix  G' = 0.40·R + 0.90·G + 0.18·B    # marker = screen in G', screen level kept",
        "level   G' to plate G over clean screen",
        "copy    G' -> R and -> B, each levelled to the plate",
        "matte   M = 1.55·R - 0.39·G + 0.70·B     # marker 1, screen 0",
        "        black 0.08, white 0.60; grow 3 px; soften 1.5 px",
        "mix     rebuilt through M",
        "grain   out = clean + (plate - denoised)",
      ].join("\n"),
      "text",
    ),
    h2("Parameter guidance"),
    table(
      ["Parameter", "Typical range", "Why"],
      [
        ["Marker samples", "3–9 boxes, flat cores", "Edge pixels are blends and bias the solve."],
        ["Screen samples", "Beside each marker, within 20–60 px", "The screen is uneven; keep samples local."],
        ["Hide row", "Off-diagonal within about ±1.5", "The row's length is its noise gain."],
        ["Residual", "Below 1% of screen level", "Above that a faint ghost survives."],
        ["Matte black / white", "0.05–0.15 / 0.5–0.9", "Clip screen noise; fill marker cores."],
        ["Grow", "1–4 px at 2K; more with motion blur", "Covers the fringe where tape meets screen."],
        ["Soften", "Sigma 1–2 px", "Hides the matte edge without spreading onto fine foreground."],
      ],
    ),
    works(
      "The screen is roughly even around each marker, the markers are one flat colour clearly apart in hue from the screen, and the foreground near them does not contain that colour. Motion blur and defocus cost nothing.",
    ),
    fails(
      "The foreground shares the marker hue, like a pink jacket crossing pink crosses: the matte takes the jacket and the rebuild strips its colour. Limit the matte with a drawn shape or paint those frames. Shiny tape catching a light is no longer one colour and fails too.",
    ),
    caution(
      "Matrix in linear light only: in a display or log encoding a blend is not a straight line between the two colours, and edges leave an outline. Never skip the grain step, or the rebuilt area carries identical grain in all three channels and reads as grey clumps.",
    ),
  ),
  uses: [
    { shot: "SLM_040_0120", outcome: "clean", note: "Pink crosses behind the reeds; solved on six marker boxes, residual well under 1%. Reeds untouched.", by: "lena.strandberg@kestrel.test" },
    { shot: "SLM_040_0130", outcome: "clean", note: "Yellow dots on blue; hid them in blue. Flattened the screen first so one level match held across frame.", by: "artist@kestrel.test" },
    { shot: "SLM_070_0010", outcome: "touch-up", note: "Clean on the screen; two crosses behind the double's hair needed a hand-drawn limit on the matte and eight frames of paint.", by: "dara.pellow@kestrel.test" },
    { shot: "LTH_104_0030", outcome: "failed", note: "The skier's jacket is the same pink as the tape; the matte took the jacket. Went back to paint for this one.", by: "artist@kestrel.test" },
    { shot: "LTH_101_0020", outcome: "clean", note: "Crosses in the cab windows; one solve covered all three windows.", by: "kofi.ashdown@kestrel.test" },
  ],
};

// ---------------------------------------------------------------------------------------------
// Tracking markers: the older method it replaced
// ---------------------------------------------------------------------------------------------

const markerPatchesByCloneOffset: DemoTechnique = {
  key: "marker-patches-by-clone-offset",
  title: "Marker patches by clone offset",
  summary: "Paint out each tracking marker with a tracked, soft-edged clone patch of the screen beside it.",
  aliases: ["clone out markers", "paint out tracker dots", "marker paint", "patch markers", "clone tape crosses"],
  tags: ["tracking-markers", "green-screen", "blue-screen"],
  author: "lead@kestrel.test",
  lifecycle: "retired-superseded",
  supersededBy: "marker-channel-cleanup",
  body: doc(
    h2("Recognising the problem"),
    p(
      "Tape crosses or dots on the screen or on set surfaces that must not reach the comp. This method treats each marker on its own, so it suits a handful of markers, not a screen full of them.",
    ),
    h2("Steps"),
    ol(
      "**Track.** Track each marker with a point track, or the screen plane with a planar track if the camera moves a lot. A marker is a good tracking target; that is what it was put there for.",
      "**Place a clone patch** over the marker: a round or rounded-square soft shape a little larger than the marker, sourcing screen from an offset beside it. Pick the offset toward screen of the same brightness: along the screen's lighting falloff, not across it.",
      "**Attach the patch to the track** so both the shape and its source move with the marker.",
      "**Feather** the shape edge so the seam disappears into the screen's own variation.",
      "**Play at speed** and look for a sliding texture or a square of different brightness that travels with the marker.",
      "**Repeat** for every marker. Group markers that share a track on a planar surface into one patch layer to save time.",
    ),
    h2("Parameter guidance"),
    table(
      ["Parameter", "Typical range", "Why"],
      [
        ["Clone offset", "1–2 marker widths", "Close enough to match the screen level, far enough to miss the marker's own fringe."],
        ["Patch size", "Marker plus 3–6 px", "Covers motion blur and the soft edge of the tape."],
        ["Feather", "25–50% of the patch radius", "A hard seam shows instantly on a smooth screen."],
      ],
    ),
    works(
      "A few markers, a slow or locked camera, an even screen and no foreground passing over the markers.",
    ),
    fails(
      "An uneven screen (the offset patch arrives brighter or darker and shows as a moving square), markers passing behind hair or reeds, and shots with dozens of markers over hundreds of frames, where the hours add up.",
    ),
    caution(
      "The patch copies grain from its source, so an offset smaller than the grain's clumps makes a visible doubled pattern. Keep the offset above a few pixels.",
    ),
  ),
  uses: [
    { shot: "SLM_040_0150", outcome: "touch-up", note: "Fine on the screen; the patches slid behind the wet hair in the last forty frames and needed paint.", by: "dara.pellow@kestrel.test" },
    { shot: "LTH_101_0020", outcome: "clean", note: "First pass on the cab windows, before the channel method was written up.", by: "lena.strandberg@kestrel.test" },
  ],
};

// ---------------------------------------------------------------------------------------------
// Wire or rig
// ---------------------------------------------------------------------------------------------

const wireRemovalByOffsetStrip: DemoTechnique = {
  key: "wire-removal-by-offset-strip",
  title: "Wire removal by offset strip",
  summary: "Fill a thin wire from the background on both sides of it, shifted across the wire and averaged, through a soft strip matte.",
  aliases: ["remove safety wire", "wire paint", "cable removal", "stunt wire cleanup", "rig wire removal", "guy wire"],
  tags: ["wire-or-rig", "sky", "green-screen"],
  author: "kofi.ashdown@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "wire-or-rig",
  body: doc(
    h2("Recognising the problem"),
    p(
      "Safety wires and guy lines show as thin lines, dark against sky or screen and bright against dark backgrounds, running straight or in a gentle curve from a harness or prop to somewhere out of frame. They sway a little and often appear doubled or smeared by motion blur. Look at a single channel zoomed in: a wire a few pixels wide on a smooth background is the easy case this page is about.",
    ),
    h2("Decide first"),
    ul(
      "**Smooth background** (sky, screen, plain wall): use the offset strip below.",
      "**Textured background** (reeds, brick, foliage): use a tracked clean plate from frames where the wire is elsewhere, or a clean frame painted once and tracked on.",
      "**Wire over the performer:** clean plate of the costume from another frame, warped into place, or frame-by-frame paint. Budget for it.",
    ),
    h2("Steps"),
    ol(
      "**Draw the strip.** Make a thin open-spline shape along the wire. Its width is the wire plus its motion blur plus about 2 px each side.",
      "**Animate it** by tracking the two ends: the lower end follows the harness or prop, the upper end follows the rig. Add a middle point only if the wire bows.",
      "**Make two fills.** Shift the plate perpendicular to the wire by the offset distance, once from each side, so the background beside the wire lands on it.",
      "**Average the two fills.** If the background has a gradient across the wire, one side is too bright and the other too dark; the average lands in between.",
      "**Mix** the averaged fill through the softened strip matte.",
      "**Regrain** (see the caution below) and play at speed, looking for a band that boils or slides where the wire crosses a gradient or an edge.",
    ),
    codeBlock(
      [
        "n    = unit normal to the wire, d = offset in px",
        "fill = 0.5 · (shift(plate, +d·n) + shift(plate, -d·n))",
        "out  = fill · strip + plate · (1 - strip)",
      ].join("\n"),
      "text",
    ),
    h2("Parameter guidance"),
    table(
      ["Parameter", "Typical range", "Why"],
      [
        ["Strip width", "Wire + blur + 2–4 px", "Too narrow leaves a dark fringe; too wide copies more background than needed."],
        ["Offset", "2–4 × the strip width", "The source must be clear of the wire's own soft edge on both sides."],
        ["Strip softness", "Sigma 0.5–1.5 px", "Blends the seam; more than this blurs the wire back in."],
        ["Added grain", "About 0.7 × plate grain", "Averaging two fills lowers the grain inside the strip."],
      ],
    ),
    works(
      "The background within a few wire-widths is smooth or only slowly changing, and the wire is thin, under about 6 px at 2K.",
    ),
    fails(
      "The wire lies along an edge or crosses the outline of the performer: the shifted copy brings the edge with it and you get a doubled outline. Also fails on strong texture, where the averaged fill looks like a blurred stripe.",
    ),
    caution(
      "Averaging two independent fills lowers grain by a factor of √2. To bring it back to the plate's level, add grain with a standard deviation of about 0.71 × the plate's (√(1 − ½)), or take the fill from one side only on very grainy plates.",
    ),
  ),
  uses: [
    { shot: "SLM_010_0010", outcome: "clean", note: "Guy wire from the survey pole against overcast sky; two-sided strip, no regrain needed at that grain level.", by: "lena.strandberg@kestrel.test" },
    { shot: "SLM_070_0010", outcome: "clean", note: "Safety wire against the green screen above the parapet; tracked both ends.", by: "dara.pellow@kestrel.test" },
    { shot: "SLM_070_0030", outcome: "touch-up", note: "Strip was fine on screen; twelve frames where the wire crosses the sleeve needed a clean plate of the sleeve from frame 1031.", by: "kofi.ashdown@kestrel.test" },
  ],
};

// ---------------------------------------------------------------------------------------------
// Dust and scratches
// ---------------------------------------------------------------------------------------------

const dustBustingWithATemporalMedian: DemoTechnique = {
  key: "dust-busting-with-a-temporal-median",
  title: "Dust busting with a temporal median",
  summary: "Find specks that exist in one frame only by comparing each frame with its aligned neighbours, and replace them with the median of the three.",
  aliases: ["dustbust", "film dust removal", "remove dirt on scan", "spot removal", "hair on scan", "dust and scratch cleanup"],
  tags: ["dust-and-scratches", "sky"],
  author: "wen.halloway@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "dust-and-scratches",
  body: doc(
    h2("Recognising the problem"),
    ul(
      "**Film dust:** sharp-edged specks that exist for one frame only. On scans of negative they show bright after the inversion; on positive stock they show dark.",
      "**Hairs:** thin curved lines, usually for one to a few frames.",
      "**Scratches:** lines at the same horizontal position over many frames, running with the film path. Scratches in the emulsion can be coloured.",
      "**Sensor dust** on digital cameras: soft dark blobs in the same place every frame, clearest on sky and at small apertures. This page does not cover it; see the caution.",
    ),
    p("Step through frames rather than playing: one-frame dirt flickers when stepping and is easy to miss at speed."),
    h2("Steps"),
    ol(
      "**Align neighbours.** Motion-compensate the previous and next frames onto the current one. On a locked shot this is a no-op; on moving shots it is where most failures come from.",
      "**Detect spikes.** A pixel is dirt when both neighbours agree with each other, and the current frame differs from both in the same direction by more than the spike threshold.",
      "**Clean up the detection:** grow the marks by a pixel or two and keep only blobs within the size limits, so grain peaks and large moving objects are left alone.",
      "**Replace** the marked pixels with the median of the three aligned frames.",
      "**Review** the difference between input and output, stepping frame by frame. It should show dirt and nothing else.",
    ),
    codeBlock(
      [
        "for each pixel in frame t (t-1 and t+1 aligned to t):",
        "  a = prev, c = cur, n = next",
        "  if |a - n| < agree and (c - a)·(c - n) > 0 and min(|c - a|, |c - n|) > spike:",
        "      mark",
        "grow marks 1-2 px; keep blobs with min_area <= area <= max_area",
        "out = median(a, c, n) through the marks, plate elsewhere",
      ].join("\n"),
      "text",
    ),
    h2("Parameter guidance"),
    table(
      ["Parameter", "Typical range", "Why"],
      [
        ["Spike threshold", "3–6 × grain standard deviation", "Lower and grain peaks are taken for dust."],
        ["Agree threshold", "1–2 × grain standard deviation", "The neighbours must show the same picture, or the detail is motion, not dirt."],
        ["Blob area", "2 px to about 0.05% of the frame", "Single pixels are grain; large blobs are usually real moving things."],
        ["Grow", "1–2 px", "Dust has a soft halo from the scanner optics."],
        ["Window", "3 frames; 5 for heavy dirt", "Dirt that sits on two consecutive frames needs the wider window."],
      ],
    ),
    works("The picture changes little between frames, or the motion estimate is good, and the dirt is on one frame only."),
    fails(
      "Fast motion and occlusion: the neighbours disagree, or worse, the alignment is wrong and real detail is taken for dirt (blinking eyes, hands, thrown props). Falling snow, rain, sparks and glints are real one-frame events and the detector eats them. Exclude those areas with a hand-drawn mask and clean them by hand.",
    ),
    caution(
      "Persistent defects escape a temporal detector because they are in every frame. Treat sensor dust as a fixed darkening and divide it out with a dust map, the way an uneven screen is flattened. Repair a scratch by interpolating across it from the pixels on either side.",
    ),
  ),
  uses: [
    { shot: "LTH_203_0010", outcome: "clean", note: "Heavy dust and hairs on the market flashback; 3-frame window, then the running scratch by hand.", by: "artist@kestrel.test" },
    { shot: "LTH_203_0020", outcome: "touch-up", note: "It took the snowflakes along with the dust. Masked the falling snow out and cleaned those areas by hand.", by: "lena.strandberg@kestrel.test" },
  ],
};

// ---------------------------------------------------------------------------------------------
// Dead or stuck pixels
// ---------------------------------------------------------------------------------------------

const deadAndStuckPixelRepair: DemoTechnique = {
  key: "dead-and-stuck-pixel-repair-with-a-sensor-map",
  title: "Dead and stuck pixel repair with a sensor map",
  summary: "Build a map of one camera's defective pixels from many frames, then replace them from their neighbours in every shot from that camera.",
  aliases: ["hot pixel fix", "stuck pixel removal", "dead pixel fix", "bright dot same place", "sensor defect map", "pixel mapping"],
  tags: ["dead-or-stuck-pixels", "night-exterior"],
  author: "lead@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "dead-or-stuck-pixels",
  body: doc(
    h2("Recognising the problem"),
    p(
      "A defective photosite shows as a pixel, or a tiny cluster, that stays in the **same place on the frame** while the picture moves. Hot pixels glow in the blacks; stuck pixels hold one colour, often pure red, green or blue; dead pixels stay black. They are worst on night exteriors and long exposures. After debayering and compression a single defect spreads into a small cross or 3×3 blob with a coloured fringe.",
    ),
    p(
      "The test that separates a defect from a star, a glint or a distant lamp: on a moving camera, real things move with the picture; defects stay fixed to the sensor.",
    ),
    h2("Steps"),
    ol(
      "**Collect frames** from one camera body: as many shots as possible, ideally dark ones. A lens-cap frame from the camera department is the best source.",
      "**Score every pixel** in every frame: its difference from the median of its 3×3 neighbours, divided by a robust noise estimate of the frame (the median absolute deviation).",
      "**Keep persistent outliers.** A pixel that scores above the threshold in most frames is a defect. Store its position and the channel or channels affected.",
      "**Grow the map** to the defect's spread: 1 px for raw-like material, a 3×3 neighbourhood after debayer and compression.",
      "**Repair** each mapped pixel from the median of its unaffected neighbours, per channel. Along strong edges, interpolate along the edge direction instead.",
      "**Apply the same map** to every shot from that camera, and keep it with the camera's notes so the next shot is instant.",
    ),
    codeBlock(
      [
        "score(x, y, t) = |I - median3x3(I)| / (1.4826 · MAD(frame t))",
        "defect(x, y)   = fraction of frames with score > k  >=  persistence",
      ].join("\n"),
      "text",
    ),
    h2("Parameter guidance"),
    table(
      ["Parameter", "Typical range", "Why"],
      [
        ["Threshold k", "5–8", "Grain alone rarely goes past this; defects go far past it."],
        ["Persistence", "80–95% of frames", "Real bright things come and go as the camera moves; defects do not."],
        ["Frames sampled", "50–200 across several shots", "Different pictures wash out real detail from the score."],
        ["Repair radius", "1 px; 3×3 after debayer", "Leaves no coloured ring after the repair."],
      ],
    ),
    works("Several shots from the same camera body are available, and the camera moves in at least some of them."),
    fails(
      "Locked-off shots of a starry sky or a field of distant lights: a star and a hot pixel look alike and both persist. Ask for a dark frame, or check against another camera's angle.",
    ),
    caution(
      "Repair before any resize, reformat or lens-distortion step. Those spread one bad pixel over several, and the repair has to grow to match.",
    ),
  ),
  uses: [
    { shot: "LTH_101_0040", outcome: "clean", note: "Map from 120 frames across the second camera's night shots: one stuck red pixel, two hot ones.", by: "artist@kestrel.test" },
    { shot: "LTH_101_0050", outcome: "clean", note: "Same map applied; nothing new to add.", by: "artist@kestrel.test" },
  ],
};

// ---------------------------------------------------------------------------------------------
// Uneven screen
// ---------------------------------------------------------------------------------------------

const screenFlattening: DemoTechnique = {
  key: "screen-flattening-by-normalized-convolution",
  title: "Screen flattening by normalized convolution",
  summary: "Estimate the clean screen behind the foreground with a masked blur, divide the plate by it and multiply by one target colour.",
  aliases: ["even out green screen", "fix patchy screen", "screen falloff fix", "flatten blue screen", "screen correction", "clean screen estimate"],
  tags: ["uneven-screen", "green-screen", "blue-screen"],
  author: "maud.okonjo@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "uneven-screen",
  body: doc(
    h2("Recognising the problem"),
    p(
      "A backing that is brighter in one corner, falls off toward the floor or the frame edges, or carries creases and seams. A key pulled on it needs settings that are too hard where the screen is dark and too soft where it is bright: holes in the matte in one place, a grey screen left in another. Look at the screen's own channel on its own: if you can see the lighting pattern, flatten before keying.",
    ),
    h2("Why it works"),
    p(
      "In linear light, uneven lighting multiplies the screen by a slowly changing field. If we knew the clean screen everywhere, including behind the foreground, dividing by it would take that field out. ",
      b("Normalized convolution"),
      " gives that estimate: blur only the screen pixels, then divide by the blurred mask, so each point gets a weighted average of the screen pixels near it and the foreground is never counted.",
    ),
    codeBlock(
      [
        "mask = 1 on clean screen, 0 on foreground, markers and edges",
        "est  = blur(plate · mask, σ) / blur(mask, σ)     # per channel",
        "flat = plate / est · target",
      ].join("\n"),
      "text",
    ),
    h2("Steps"),
    ol(
      "**Linearise.** Division only undoes lighting in linear light.",
      "**Build the clean-screen mask:** a rough key inverted, minus the markers, then shrunk by a few pixels so blended edge pixels are not counted as screen.",
      "**Estimate** the clean screen with the formula above, per channel.",
      "**Check for holes.** Where the blurred mask is near zero (a large foreground with no screen within reach) the estimate is undefined. Raise sigma, or fill the remaining holes from a larger blur.",
      "**Divide and multiply** by the target colour: the median of the screen, or the colour the show's keying setup expects.",
      "**Key the flattened plate.** Use the flat plate to pull the matte, and keep the original for the foreground colour.",
    ),
    h2("Parameter guidance"),
    table(
      ["Parameter", "Typical range", "Why"],
      [
        ["Sigma", "20–100 px at 2K", "Larger than the widest foreground part, so the estimate reaches behind it; smaller follows creases better."],
        ["Mask shrink", "2–6 px", "Edge pixels are screen mixed with foreground and would tint the estimate."],
        ["Target colour", "Median of the clean screen", "Keeps the overall screen level, so the keyer's settings still make sense."],
        ["Hole limit", "Blurred mask below about 0.01", "Below this the division amplifies noise into blotches."],
      ],
    ),
    works(
      "The screen changes slowly compared with sigma, and there is clean screen around most of the foreground. Markers are fine if they are removed first or left out of the mask.",
    ),
    fails(
      "Sharp creases and seams narrower than sigma survive as faint lines; run a second pass with a small sigma limited to the crease. A foreground that covers most of the frame leaves too little screen to estimate from.",
    ),
    caution(
      "The division also changes the foreground, by the inverse of the lighting there. That is why the flat plate feeds the key only. If you must use its colour, mix it back only through the screen side of the matte.",
    ),
  ),
  uses: [
    { shot: "SLM_040_0130", outcome: "clean", note: "Screen darker camera left; sigma 60 at 2K, then one level match held for the marker cleanup.", by: "artist@kestrel.test" },
    { shot: "LTH_104_0010", outcome: "clean", note: "Large blue screen with strong falloff at both edges; sigma 90, hole fill for the snow bank.", by: "wen.halloway@kestrel.test" },
    { shot: "LTH_101_0020", outcome: "touch-up", note: "Overall flat, but the crease in the back window survived; second pass at sigma 6 on the crease only.", by: "kofi.ashdown@kestrel.test" },
  ],
};

// ---------------------------------------------------------------------------------------------
// Grain and noise
// ---------------------------------------------------------------------------------------------

const grainRestoreAfterDenoise: DemoTechnique = {
  key: "grain-restore-after-denoise",
  title: "Grain restore after denoise",
  summary: "Do the cleanup on a denoised plate, then add back the plate's own grain as plate minus denoised, so patched areas carry the original grain.",
  aliases: ["regrain", "put grain back", "grain match", "grain mismatch on patch", "degrain regrain", "noise restore"],
  tags: ["grain-and-noise", "night-exterior"],
  author: "senior@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "grain-and-noise",
  body: doc(
    h2("Recognising the problem"),
    p(
      "A patch that is too smooth, too sharp or grained differently from its surround. It may be invisible on a still and obvious in motion: a soft window of calm in a boiling plate, or grain that moves with the patch instead of staying put. Colour-channel tricks (copying one channel into another) give grain that is the same in every channel, which reads as grey clumps.",
    ),
    h2("The method"),
    p(
      "Denoise the plate once per shot, do every cleanup step on the denoised version, then add back the grain you took out. The difference between the plate and its denoised version is the grain, in the right place, frame by frame, so the patched areas end up with the very grain that was there.",
    ),
    codeBlock(["grain = plate - denoised", "out   = clean + grain"].join("\n"), "text"),
    h2("Steps"),
    ol(
      "**Denoise** the plate with settings that remove grain but not picture detail.",
      "**Inspect the grain image** (plate minus denoised) at a raised gain. It should look like even noise everywhere. Any outline of an edge, a marker or a face means the denoise was too strong there.",
      "**Clean up** on the denoised plate: markers, wires, dust, anything.",
      "**Add the grain image** to the cleaned result.",
      "**Compare in motion** against the plate at the same zoom, channel by channel.",
    ),
    h3("When there is no denoised plate"),
    p("For patches from other shots or from generated material, match grain by measurement instead. Measure on flat areas of the plate:"),
    table(
      ["Measure", "Typical value", "Why it matters"],
      [
        ["Amplitude per channel", "Blue often the largest on film and on many sensors", "A patch with equal amplitude in all channels looks wrong in the blue."],
        ["Amplitude against brightness", "Changes with level; measure at three levels or more", "Grain is signal-dependent. One value is right only at one brightness."],
        ["Grain size", "Blur of 0.5–1.5 px on the generated noise", "Matches the clump size; check with a zoomed side-by-side."],
        ["Channel correlation", "Low on film, higher on debayered digital", "Fully independent grain on a digital plate looks too colourful."],
      ],
    ),
    works("The denoise is clean: the grain image shows no structure. Then the result is exact outside the patches and right inside them."),
    fails(
      "Grain depends on brightness. Where the patch replaces something much brighter or darker than what goes in its place (a pale wire on dark sky, a dark figure on a bright wall), the grain image carries the removed thing's grain level, not the background's. Thin repairs pass; large ones need generated grain matched by measurement.",
    ),
    caution(
      "An over-strong denoise puts picture detail into the grain image, and adding it back prints a faint outline of the removed marker or wire. Lower the denoise or restrict it near the repairs.",
    ),
  ),
  uses: [
    { shot: "SLM_040_0120", outcome: "clean", note: "Grain image clean after a gentle denoise; regrained after the marker cleanup.", by: "lena.strandberg@kestrel.test" },
    { shot: "LTH_101_0010", outcome: "clean", note: "Heavy night noise; denoise kept the snow, grain image had no structure.", by: "artist@kestrel.test" },
    { shot: "LTH_104_0010", outcome: "touch-up", note: "Outline of the snow bank in the grain image; lowered the denoise near the bank and redid it.", by: "wen.halloway@kestrel.test" },
  ],
};

// ---------------------------------------------------------------------------------------------
// Boom or shadow: approved, with an edit waiting for review
// ---------------------------------------------------------------------------------------------

const boomShadowLift: DemoTechnique = {
  key: "boom-shadow-lift-by-gain-matching",
  title: "Boom shadow lift by gain matching",
  summary: "Lift a boom or crew shadow back to the lit level with a measured gain through a soft matte that follows the penumbra, keeping the surface's own texture.",
  aliases: ["remove boom shadow", "mic shadow on wall", "crew shadow removal", "shadow lift", "relight shadow", "boom dip"],
  tags: ["boom-or-shadow", "night-exterior"],
  author: "senior@kestrel.test",
  lifecycle: "in-review-edit",
  houseMethodFor: "boom-or-shadow",
  body: doc(
    h2("Recognising the problem"),
    p(
      "A soft dark band or blob that drifts across a wall, floor or set dressing, usually in and out with the dialogue. Its edge softness follows the size of the light that casts it. The boom itself may dip into the top of frame for a few frames; that part is a paint job, but the shadow usually is not.",
    ),
    h2("Why it works"),
    p(
      "A shadow takes away part of the light that falls on the surface. In linear light the shadowed surface is the lit surface times an attenuation between 0 and 1, and the surface texture is still there underneath. Dividing by that attenuation brings the surface back with its own texture, which is far better than cloning a wall.",
    ),
    h2("Steps"),
    ol(
      "**Linearise** the plate; the lift is a multiplication and only holds in linear light.",
      "**Find a reference:** the same surface just outside the shadow, or better, a frame where the shadow is gone, aligned to this one.",
      "**Measure the attenuation.** With a clean frame, take the ratio of the lightly blurred plate to the lightly blurred clean frame. Without one, measure one gain from the brightness of matched patches inside and outside the shadow.",
      "**Build the matte** around the shadow with an edge as soft as the penumbra, and track or animate it with the boom.",
      "**Divide** the plate by the attenuation through the matte.",
      [
        "**Regrain.** Lifting by a gain raises the grain in the shadow by the same gain. Do the lift on a denoised plate and restore the grain afterwards (see ",
        link("Grain restore after denoise", "/techniques/grain-restore-after-denoise"),
        ").",
      ],
    ),
    codeBlock(
      [
        "A   = blur(plate, s) / blur(clean, s)     # attenuation, 0..1",
        "out = plate / max(A, floor)  through the shadow matte",
      ].join("\n"),
      "text",
    ),
    h2("Parameter guidance"),
    table(
      ["Parameter", "Typical range", "Why"],
      [
        ["Ratio blur s", "2–6 px", "Removes grain and small misalignment from the ratio; more smears the penumbra."],
        ["Gain (1 / A)", "1.2–3", "Beyond about 3 the lifted grain and crushed blacks show whatever you do."],
        ["Floor", "0.2–0.3", "Stops the division from exploding where the plate is near black."],
        ["Matte edge", "As soft as the shadow's penumbra", "A harder edge leaves a light or dark rim."],
      ],
    ),
    works("The shadow falls on one material under one light, and the surface has texture worth keeping: boards, plaster, brick."),
    fails(
      "The shadow crosses several surfaces or the performer: each needs its own gain and matte. A hard-edged shadow from a small light that moves fast leaves a flickering rim unless the matte tracks it exactly.",
    ),
    caution("Check the blacks after lifting. If the shadowed area was already near black, no gain brings back detail that was never recorded."),
  ),
  edit: {
    summary:
      "Lift a boom or crew shadow back to the lit level with a measured gain per channel, through a soft matte that follows the penumbra, keeping the surface's own texture.",
    bodyAppend: [
      h3("Coloured shadows under mixed light"),
      p(
        "Outside at night or at dusk, the light left inside a shadow is often a different colour from the key: a cool fill from the sky, a warm practical. Then the shadow is not just darker but tinted, and one gain leaves a coloured patch. Measure the attenuation **per channel** and divide each channel by its own.",
      ),
      table(
        ["Channel", "What to expect", "Check"],
        [
          ["Red", "Usually the most attenuated under a cool fill", "Lifted area should not go warm against the surround."],
          ["Green", "Close to the brightness gain", "Use it to judge the overall lift."],
          ["Blue", "Least attenuated under a cool fill", "Lifted area should not go blue; if it does, the ratio blur is too small."],
        ],
      ),
      fails("The fill changes colour across the shadow itself, for example a practical lamp near one end. Split the shadow into two mattes with their own gains."),
    ],
    changeNote: "Add per-channel gains for shadows under mixed light; the single gain left a blue patch on SLM_110_0200.",
  },
  uses: [
    { shot: "SLM_110_0200", outcome: "clean", note: "Clean frame at 1160 after the boom lifted; per-channel ratio, the single gain left the boards blue.", by: "dara.pellow@kestrel.test" },
  ],
};

// ---------------------------------------------------------------------------------------------
// Reflections: submitted, waiting for review
// ---------------------------------------------------------------------------------------------

const crewReflections: DemoTechnique = {
  key: "crew-reflections-in-glass-and-water",
  title: "Crew reflections in glass and water",
  summary: "Remove camera, crew and lights from reflections by tracking the reflection's own motion and subtracting the difference to a clean frame in linear light.",
  aliases: ["camera in window reflection", "crew in reflection", "reflection in puddle", "remove reflected light", "window reflection cleanup"],
  tags: ["reflections", "crew-in-shot", "water", "night-exterior"],
  author: "kofi.ashdown@kestrel.test",
  lifecycle: "in-review",
  body: doc(
    h2("Recognising the problem"),
    p(
      "Glass, water, polished paint and eyes show the camera, the operator, a work light or someone in a bright jacket. The tell: a reflection does not move with the surface. In a flat pane or still water the reflected object appears as far behind the surface as it really is in front of it, so it slides across the glass with the parallax of that depth, not of the glass.",
    ),
    h2("Why it works"),
    p(
      "What you see in glass is the light coming through it plus the light reflected off it; in linear light the two simply add. A crew member in the reflection changes only the reflected part. Take the difference between this frame and a clean frame aligned on the reflection, and that difference is the unwanted reflection (plus anything that changed behind the glass, which the matte has to exclude).",
    ),
    h2("Steps"),
    ol(
      "**Linearise.** The layers only add in linear light.",
      "**Find a clean source:** frames where the person has moved, a clean pass, or for water a stretch of frames the object never reached.",
      "**Align on the reflection,** not on the surface: track the reflected background, or treat it as a plane behind the glass at the mirrored distance.",
      "**Take the difference** between the plate and the aligned clean frame inside the reflection area.",
      "**Subtract the difference** through a soft matte limited to the unwanted reflection.",
      "**For rippled water,** use the median of several aligned clean frames as the reflection and keep the plate's own ripple highlights outside the matte.",
      "**Regrain** and play at speed; a reflection that stops moving with the camera gives itself away.",
    ),
    h2("Parameter guidance"),
    table(
      ["Parameter", "Typical range", "Why"],
      [
        ["Matte softness", "Sigma 3–10 px", "Reflections are soft; a hard edge shows."],
        ["Median window (water)", "5–15 aligned frames", "Enough to average the ripples out, few enough that the light does not change."],
        ["Alignment", "Track on the reflected scene", "Aligning on the glass drags the wrong layer."],
      ],
    ),
    works("What is behind the glass holds still, and a clean frame of the reflection exists within a second or two."),
    fails(
      "No clean frame exists (the operator never leaves), or the scene behind the glass moves in step with the reflection. Then paint a clean reflection once and track it in.",
    ),
    caution(
      "Do not remove every reflection. Glass with no reflection at all reads as an empty frame. Keep the environment's reflection; take out only the crew and kit.",
    ),
  ),
};

// ---------------------------------------------------------------------------------------------
// Logos and signage: a senior's draft
// ---------------------------------------------------------------------------------------------

const signAndLogoRemoval: DemoTechnique = {
  key: "sign-and-logo-removal-with-a-tracked-clean-patch",
  title: "Sign and logo removal with a tracked clean patch",
  summary: "Paint one clean frame of a flat sign, track it on with a planar track, and match its brightness to the plate frame by frame.",
  aliases: ["remove brand logo", "sign removal", "poster removal", "clearance paint", "number plate removal"],
  tags: ["logos-and-signage"],
  author: "senior@kestrel.test",
  lifecycle: "draft",
  body: doc(
    h2("Recognising the problem"),
    p(
      "Clearance asks for a brand mark, a shop sign, a poster or a number plate to go. Most of these are flat, rigid surfaces, which makes them good candidates for one painted frame carried through the shot.",
    ),
    h2("Steps (draft)"),
    ol(
      "**Planar-track the surface** the sign is on. Use corners and edges of the surface, not the logo itself, so the track survives once the logo is gone.",
      "**Pick the best frame:** largest, sharpest and least occluded.",
      "**Paint the clean frame** on the denoised plate: clone surface texture over the mark, keeping wear, dirt and the surface's lighting gradient.",
      "**Track it on** by corner-pinning the painted frame with the planar track.",
      "**Match brightness over time:** fit a gain, and an offset if the light changes, between the patch and the plate on a ring just outside the mark, frame by frame.",
      "**Restore grain** and check edges where the patch meets the surface's border.",
    ),
    caution(
      "Motion blur: the painted frame is sharp. On fast moves, blur the patch along the track's motion per frame, or the patch looks pasted on.",
    ),
    fails("People and objects pass in front of the sign. Those frames need a hand-drawn holdout, and anything reflective on the sign (glossy vinyl) changes with angle and will not hold a single painted frame."),
    p(i("To do: a parameter table once SLM_140_0080 comes off hold, and a note on the letters reflected in the quay puddles.")),
  ),
};

// ---------------------------------------------------------------------------------------------
// Crew in shot
// ---------------------------------------------------------------------------------------------

const crewRemovalWithATemporalCleanPlate: DemoTechnique = {
  key: "crew-removal-with-a-temporal-clean-plate",
  title: "Crew removal with a temporal clean plate",
  summary: "Build a clean background from the frames where the crew member or vehicle is elsewhere, align it to each frame, and put it back through a soft matte.",
  aliases: ["remove person from background", "van removal", "crew in background", "clean plate from other frames", "people removal"],
  tags: ["crew-in-shot", "sky"],
  author: "maud.okonjo@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "crew-in-shot",
  body: doc(
    h2("Recognising the problem"),
    p(
      "A crew member, a parked van or a stand somewhere behind the action, usually small in frame and partly covered by the cast. If the unwanted thing moves during the shot, or the camera moves enough to see behind it, the background it hides is somewhere in the shot already. That is the case this page covers; a thing that never moves and is never seen past needs paint or a separate clean pass.",
    ),
    h2("Steps"),
    ol(
      "**Track the background** the unwanted thing sits on: a planar track for walls and ground, a camera solve for deep scenes.",
      "**Align a run of frames** to the frame being fixed, using the track. Twenty to fifty frames either side is usually plenty.",
      "**Take the median** of the aligned frames per pixel. Anything that moves through the background is outvoted, as long as each pixel is clear in more than half the frames.",
      "**Match the light:** fit a gain and offset between the clean plate and the current frame over background near the repair, frame by frame, so clouds and flicker stay in step.",
      "**Matte the removal** with a shape a few pixels larger than the thing, soft at the edge, and hold out the cast where they cross it.",
      "**Mix** the clean plate through the matte and restore the grain.",
    ),
    h2("Parameter guidance"),
    table(
      ["Parameter", "Typical range", "Why"],
      [
        ["Frames in the median", "20–100, aligned", "More frames outvote slow movers; too many and the light drifts."],
        ["Matte margin", "3–8 px", "Covers motion blur and the soft edge of the removed thing."],
        ["Light match", "Gain + offset, per frame", "A clean plate from other frames is lit by other moments."],
      ],
    ),
    works("The background is rigid (buildings, ground, a sea wall) and the thing to remove moves or is seen past during the shot."),
    fails("The thing stays put for most of the shot: the median keeps it. Leaves, water and crowds in the background do not align and the median smears them; paint a single clean frame and track it on instead."),
    caution("Shadows and reflections go with the thing. Remove the van's shadow on the road and its reflection in the wet tarmac too, or the audience sees what the van was doing."),
  ),
  uses: [
    { shot: "SLM_010_0040", outcome: "touch-up", note: "Van behind the sea wall drove off at frame 1090; median of the later frames, the wet road needed a hand-painted fix for its reflection.", by: "lena.strandberg@kestrel.test" },
  ],
};

/** In seeding order: a superseding technique comes before the one it supersedes. */
export const DEMO_TECHNIQUES: readonly DemoTechnique[] = [
  markerChannelCleanup,
  markerPatchesByCloneOffset,
  wireRemovalByOffsetStrip,
  dustBustingWithATemporalMedian,
  deadAndStuckPixelRepair,
  screenFlattening,
  grainRestoreAfterDenoise,
  crewRemovalWithATemporalCleanPlate,
  boomShadowLift,
  crewReflections,
  signAndLogoRemoval,
];
