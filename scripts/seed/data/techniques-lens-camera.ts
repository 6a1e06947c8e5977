import { caution, doc, fails, h2, ol, p, table, works } from "@/scripts/seed/data/doc";
import type { DemoTechnique } from "@/scripts/seed/data/techniques";

/*
 * Demo write-ups for the lens and camera problems (issue 16): sensor dust, lens distortion,
 * vignetting, rolling shutter, flicker, chromatic aberration and moiré. Invented Kestrel Yard
 * notes in the department's own words, from common trade practice; no real show or person.
 */

const sensorDustMap: DemoTechnique = {
  key: "sensor-dust-removal-with-a-flat-frame",
  title: "Sensor dust removal with a flat frame",
  summary: "Divide out the soft dark spots that dust on the sensor leaves in the same place on every frame, using a flat frame from the same camera.",
  aliases: ["sensor spot removal", "dust on the sensor", "fixed dust spots"],
  tags: ["sensor-dust", "sky"],
  author: "kofi.ashdown@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "sensor-dust",
  body: doc(
    h2("Recognising it"),
    p(
      "Soft, round, slightly darker patches that do not move when the picture moves. They show most on sky and flat walls, and more at small apertures (f/11 and up) where the shadow of the dust on the filter stack is sharper. Every shot from the same camera body has them in the same place until the sensor is cleaned. Our film dust busting does not see them: a temporal detector looks for things that are on one frame only, and these are on all of them.",
    ),
    h2("Steps"),
    ol(
      "**Find a flat frame:** a sky or grey-card frame from the same camera at the same aperture, ideally defocused. Blur a copy with a large radius to get the clean falloff.",
      "**Make the dust map:** the flat frame divided by its blurred self. Dust shows as values below 1; everything else sits at 1.",
      "**Divide the plate by the map** inside a soft matte around each spot. Dividing gives back the light the dust took and keeps the texture under it, which paint would lose.",
      "**Check the colour:** dust shadows are often slightly coloured, so build the map per channel.",
      "**Keep the map per camera body** in the show folder with the date, because dust moves between cleans.",
    ),
    table(
      ["Setting", "Typical", "Why"],
      [
        ["Blur for the clean falloff", "5–10 % of frame width", "Larger than any spot, smaller than the vignette."],
        ["Spot matte", "Spot diameter plus 20 %", "The shadow's soft edge reaches further than it looks."],
        ["Aperture match", "Within one stop", "The spot's size and darkness change with the aperture."],
      ],
    ),
    works("Locked and moving cameras alike, as long as the aperture matches the flat frame's."),
    fails("Spots over busy detail at a wide aperture: the shadow is too soft to measure. Clone those once per shot and track the patch to the frame, not the scene."),
    caution("The map belongs to the sensor, not the scene: never track it to the picture, and never reuse it after a sensor clean."),
  ),
  uses: [
    { shot: "LTH_101_0040", outcome: "clean", note: "Three spots over the white-out sky, B camera. Map from the grey card at the start of the roll.", by: "kofi.ashdown@kestrel.test" },
    { shot: "LTH_203_0010", outcome: "touch-up", note: "Same B camera spots; one sat on the ridge line and needed a clone.", by: "artist@kestrel.test" },
  ],
};

const undistortForPaint: DemoTechnique = {
  key: "undistort-paint-redistort",
  title: "Undistort, paint, redistort",
  summary: "Take the lens distortion out before patches and tracks, then put exactly the same distortion back, so straight lines stay straight under paint.",
  aliases: ["lens distortion removal", "undistort plate", "st map workflow", "barrel distortion fix"],
  tags: ["lens-distortion"],
  author: "wen.halloway@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "lens-distortion",
  body: doc(
    h2("Why"),
    p(
      "Wide lenses bow straight lines toward the edges of frame: barrel distortion pushes them outward, a long lens may pull them in (pincushion). A flat patch, a planar track or a clean plate shot on another lens does not fit a bowed plate, and the mismatch grows toward the corners, exactly where rigs and stands usually stand. Working on a straightened plate makes every patch behave as if the lens were perfect.",
    ),
    h2("Steps"),
    ol(
      "**Get the lens grid** shot for this lens and focal length, and solve the distortion from it. Without a grid, use the lens model from the camera track.",
      "**Undistort with overscan,** so the corners that move outward are kept rather than cropped.",
      "**Paint and track** on the undistorted plate: planar tracks and clean plates now line up across the frame.",
      "**Redistort with the same data,** and only the paint: mix it back over the original plate through its matte.",
      "**Check the round trip** on an untouched area: it must match the plate apart from a little filtering softness.",
    ),
    table(
      ["Setting", "Typical", "Why"],
      [
        ["Overscan", "5–10 % each side", "Barrel correction pushes corners out of frame."],
        ["Resampling filter", "Sharp, without ringing", "Two resamples soften; test the round trip on grain."],
        ["Grid per focal length", "Every zoom position used", "Distortion changes along a zoom."],
      ],
    ),
    works("Any lens with a grid or a solved lens model, on locked or moving cameras."),
    fails("No grid and no straight lines in frame: the estimate is poor; keep patches small and near the centre."),
    caution("Never send the round-tripped full frame as the result: it is softer than the plate. Only the paint goes through the redistort."),
  ),
};

const vignettingCorrection: DemoTechnique = {
  key: "vignetting-correction-before-patching",
  title: "Vignetting correction before patching",
  summary: "Even out the darker corners a lens or filter stack adds before cloning across them, then put the falloff back.",
  aliases: ["dark corners fix", "corner falloff", "devignette"],
  tags: ["vignetting", "sky"],
  author: "senior@kestrel.test",
  lifecycle: "approved",
  body: doc(
    h2("Recognising it"),
    p(
      "The picture gets gradually darker toward the corners, evenly on all four, and the darkening does not move with the scene. It is strongest wide open and with stacked filters. It matters to us when a patch travels: a clean piece cloned from the middle of the frame into a corner comes out too bright, and a clean plate shot at another aperture has a different falloff from the plate it fills.",
    ),
    h2("Steps"),
    ol(
      "**Measure the falloff** on a flat frame (grey card or even sky) from the same lens and aperture, or fit a smooth radial shape to the plate's sky.",
      "**Divide the plate** by the normalised falloff, so the corners come up to the centre's level.",
      "**Patch and clone** on the flat plate.",
      "**Multiply the falloff back** on the result, so the shot still matches its neighbours.",
    ),
    h2("Checking the result"),
    p("Toggle the patched corner against the untouched plate at the same exposure: the patch must be neither brighter nor flatter than the sky or wall around it. A quick look at a luminance-only view shows a mismatched falloff at once, long before it shows in colour."),
    table(
      ["Setting", "Typical", "Why"],
      [
        ["Falloff shape", "Radial, smooth, centred on the optics", "Lens falloff has no detail."],
        ["Strength", "Often 0.5–1 stop in the corners", "More than that is usually a filter or matte box."],
      ],
    ),
    works("Smooth falloff from the lens or the filter stack, measured at the shot's aperture."),
    fails("A hard-edged dark corner from a matte box flag: that is an obstruction; paint or crop it instead."),
    caution("A vignette added in the grade is creative. Leave it alone and never correct a graded plate."),
  ),
};

const rollingShutterSkew: DemoTechnique = {
  key: "rolling-shutter-skew-correction",
  title: "Rolling shutter skew correction",
  summary: "Straighten the lean that a line-by-line sensor puts into verticals during fast pans, before tracking and paint.",
  aliases: ["jello fix", "shutter skew", "leaning verticals on pans", "flash band repair"],
  tags: ["rolling-shutter"],
  author: "wen.halloway@kestrel.test",
  lifecycle: "approved",
  body: doc(
    h2("Recognising it"),
    p(
      "Most digital sensors read their top rows before their bottom rows. In a fast pan every vertical leans; with vibration on a car or drone mount the picture ripples like jelly; a photographer's flash fired during the read lights only a band of one frame and the rest of the next. All three come from the same read-out time, which is why they belong in one write-up.",
    ),
    h2("Steps"),
    ol(
      "**Track the shot** and take the camera's speed per frame from the track.",
      "**Estimate the read-out time** for the camera (from its data sheet or by fitting until verticals stand straight).",
      "**Shear each row back** by the time it was read late multiplied by the camera's speed.",
      "**For a flash band,** combine the lit half of one frame with the lit half of the next into one evenly lit frame instead.",
      "**Track and paint** on the corrected plate.",
    ),
    h2("Checking the result"),
    p("Lay a straight line over a building edge or a door frame through the whole pan: after correction it stays upright in every frame. Play the shot at speed too; a correction that is slightly off makes the picture sway."),
    table(
      ["Setting", "Typical", "Why"],
      [
        ["Read-out time", "10–30 ms for a full frame", "Sets how far the bottom row lags the top."],
        ["Correction per frame", "From the track, not a constant", "Pans speed up and slow down."],
      ],
    ),
    works("Pans and tilts with a measurable speed; vibration with a dense track."),
    fails("Fast objects crossing a static frame lean on their own; correct them with a local warp."),
    caution("Correct before tracking: a tracker fed skewed frames solves a camera that never existed."),
  ),
};

const deflickerLights: DemoTechnique = {
  key: "deflicker-by-a-reference-area",
  title: "Deflicker by a reference area",
  summary: "Measure brightness frame by frame on a stable area and grade each frame onto the smoothed curve, to calm mains-light and time-lapse flicker.",
  aliases: ["deflicker", "flicker removal", "pulsing lights fix"],
  tags: ["flicker"],
  author: "lead@kestrel.test",
  lifecycle: "approved",
  houseMethodFor: "flicker",
  body: doc(
    h2("Recognising it"),
    p(
      "The picture, or part of it, pulses brighter and darker from frame to frame while nothing in the scene should change. Lamps on mains power pulse at twice the mains frequency and beat with the shutter; screens in shot roll; time-lapse stills are each exposed a little differently. The pulse is usually not the same in every channel, so look at red, green and blue apart.",
    ),
    h2("Steps"),
    ol(
      "**Pick a reference area** that should not change: a wall, the floor, a patch of sky, away from moving people.",
      "**Measure its mean** per frame and per channel.",
      "**Smooth the curve** over a few frames (or fit a slow trend for time-lapse).",
      "**Grade each frame** by the ratio of the smoothed value to the measured one.",
      "**Work locally** under a soft matte where only part of the frame pulses, such as one practical lamp or a screen.",
    ),
    h2("Checking the result"),
    p("Plot the measured curve again after the grade: it should be flat apart from the slow changes the scene really has. Then watch the shot at speed on a large monitor; the eye finds a leftover pulse faster than any graph."),
    table(
      ["Setting", "Typical", "Why"],
      [
        ["Smoothing window", "5–9 frames", "Long enough to remove the beat, short enough to keep real light changes."],
        ["Reference area", "As large and as still as possible", "Small areas carry grain into the curve."],
      ],
    ),
    works("Global or regional pulsing over a static or slowly moving scene."),
    fails("Flicker that belongs to the scene, firelight or candles: it must stay. Apply the scene's own flicker to any patch instead."),
    caution("Deflicker before denoising and regrain: the grain must not be graded up and down with the correction."),
  ),
};

const chromaticAberration: DemoTechnique = {
  key: "chromatic-aberration-realign-red-and-blue",
  title: "Chromatic aberration: realign red and blue",
  summary: "Remove colour fringes on high-contrast edges by scaling red and blue around the lens centre until they sit on green.",
  aliases: ["colour fringe removal", "purple fringing fix", "ca removal"],
  tags: ["chromatic-aberration"],
  author: "kofi.ashdown@kestrel.test",
  lifecycle: "approved",
  body: doc(
    h2("Recognising it"),
    p(
      "Dark edges against bright sky or windows get a red fringe on one side and a blue or purple one on the other, growing toward the corners of frame. The lens brings the three colours to slightly different sizes of image (lateral aberration). In front of and behind focus a second kind adds purple or green halos that do not depend on the position in frame.",
    ),
    h2("Steps"),
    ol(
      "**Find the optical centre,** usually the frame centre unless the plate was cropped or reframed.",
      "**Scale red** by a fraction of a percent about the centre until its edges sit on green's.",
      "**Scale blue** the same way, independently.",
      "**Desaturate what remains** inside a thin edge matte for the out-of-focus halos.",
    ),
    h2("Checking the result"),
    p("Zoom into the corners at 400 % and step along a dark edge against bright sky: red and blue should now sit exactly on green, with no coloured line on either side. Check the centre too; it should not have changed at all."),
    table(
      ["Setting", "Typical", "Why"],
      [
        ["Red and blue scale", "0.999–1.002", "Lateral aberration is tiny but visible at the corners."],
        ["Edge matte width", "2–4 px at 2K", "Only the fringe, not the colour of the object."],
      ],
    ),
    works("Lateral fringes on wide and cheap lenses, measured on edges near the corners."),
    fails("Fringes that change through a zoom or focus pull: animate the scale, or fall back to the edge desaturation."),
    caution("Do it before keying: fringes on the screen edge become coloured matte edges."),
  ),
};

const moireFabric: DemoTechnique = {
  key: "moire-on-fabric-and-screens",
  title: "Moiré on fabric and screens",
  summary: "Calm rippling interference bands on fine patterns by softening colour only inside the pattern, or replacing a display outright.",
  aliases: ["moire removal", "interference pattern fix", "wavy lines on a shirt"],
  tags: ["moire", "skin"],
  author: "senior@kestrel.test",
  lifecycle: "approved",
  body: doc(
    h2("Recognising it"),
    p(
      "A fine repeating pattern such as a striped shirt, a mesh fence or a television beats with the sensor grid and makes coloured ripples that crawl as the subject moves. The ripples are not in the real object: a frame where the pattern is larger or smaller in frame usually shows it clean. Displays in shot make broad rolling bands of their own on top.",
    ),
    h2("Steps"),
    ol(
      "**Matte the pattern** with a tracked shape, tight to the fabric or screen.",
      "**Blur the chroma only** inside the matte, keeping the luminance detail that shows the weave.",
      "**For coarse luminance moiré,** take the real weave from a frame where it did not beat and track it onto the fabric.",
      "**For a display,** replace its picture outright and keep hands and reflections on top.",
    ),
    h2("Checking the result"),
    p("Play the shot at speed and at full resolution, and compare the fabric with a frame where the pattern did not beat: the weave should read the same, with no coloured ripples and no smooth patch where the colour was calmed."),
    table(
      ["Setting", "Typical", "Why"],
      [
        ["Chroma blur", "Two to four times the ripple spacing", "Smaller leaves colour ripples; larger bleeds onto skin."],
        ["Matte edge", "Soft, 2–3 px", "A hard edge shows where the colour suddenly calms."],
      ],
    ),
    works("Colour moiré on fabric and mesh, and any display in shot."),
    fails("Moiré that runs across skin and fabric together: separate them with roto first."),
    caution("Check the result in motion: a static frame hides ripples that crawl."),
  ),
};

export const LENS_AND_CAMERA_TECHNIQUES: readonly DemoTechnique[] = [
  sensorDustMap,
  undistortForPaint,
  vignettingCorrection,
  rollingShutterSkew,
  deflickerLights,
  chromaticAberration,
  moireFabric,
];
