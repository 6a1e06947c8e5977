/**
 * Held-out search quality pages, fourth set (2026-12-06): forty invented Kestrel Yard write-ups in look-alike groups — lens distortion (6), vignetting (5), rolling shutter (5), flicker (6), chromatic aberration (6), moiré (6), sensor dust and dead or hot pixels (6).
 * Written apart from the engine, its thesaurus and lexicon and every query set. Never tune on it.
 * Trade content is common practice, no published source.
 */
import type { SearchDocument } from "@/lib/search/types";
import { pageMaker, TAGS } from "./pages";

const page = pageMaker("fp");
const T = TAGS;

export const UNSEEN_PAGES_FOURTH: SearchDocument[] = [
  // ── lens distortion ──
  page("f-distortion-barrel-wide-undistort", {
    title: "Undistorting barrel bulge on wide primes",
    summary:
      "Flattens the outward bulge of a wide prime using a solved lens profile so straight set lines can be tracked and painted cleanly.",
    aliases: ["wide lens flattening", "barrel undistort"],
    tags: [T.distortion, T.set],
    parameterNames: ["k1Coefficient", "overscanPercent"],
    shotCodes: ["KY_501_0010"],
    body:
      "You spot barrel distortion when door frames and ceiling beams near the edge of frame bow outwards like a barrel stave, while the centre looks fine. It is worst on anything wider than about 24mm. Load the lens profile solved from the grid for that prime and apply it as an undistort with around 8 percent overscan, so the stretched corners are not cropped away. Check the result by laying a straight guide along a wall edge at frame left and right; if it still bends, the profile belongs to a different focus distance. Do every track, patch and roto in the flattened space, then push the result back through the matching redistort. It falls apart on fisheye glass, where a two-term model cannot hold the extreme corners and you need a denser mesh.",
  }),
  page("f-distortion-pincushion-long-zoom", {
    title: "Pincushion correction on long zoom plates",
    summary:
      "Removes the inward pinch of a long zoom by animating the distortion strength to follow the focal length through the shot.",
    aliases: ["tele pinch fix"],
    tags: [T.distortion, T.sky],
    parameterNames: ["k1Coefficient", "focalLengthCurve"],
    shotCodes: ["KY_507_0120"],
    body:
      "Pincushion is the opposite shape to barrel: straight edges near the frame border sag inwards towards the centre, so a horizon across the top third smiles downwards. Long zooms at the tele end are the usual culprit. The catch is that a zoom changes its distortion as it racks, so a single fixed value is wrong for most of the shot. Pull the focal length from the camera metadata, or estimate it from the tracked scale change, and key the coefficient at each end of the zoom, adding a midpoint key if the lens passes through neutral. A sky replacement with a clean horizon line is a good test, because any leftover curve shows straight away. If the metadata is missing and the zoom is slow, accept a small residual and hide the seam with a soft blend instead of chasing it.",
  }),
  page("f-distortion-anamorphic-mumps", {
    title: "Handling anamorphic mumps on close-ups",
    summary:
      "Corrects the swollen-cheek look that anamorphic lenses give faces at close focus before beauty or patch work is tracked onto them.",
    aliases: ["anamorphic squeeze correction", "mumps fix"],
    tags: [T.distortion, T.skin],
    parameterNames: ["squeezeRatio", "focusDistance"],
    shotCodes: ["KY_512_0040"],
    body:
      "Anamorphic glass at close focus breathes unevenly: the horizontal squeeze weakens as focus comes in, so after a standard 2x desqueeze a face looks puffed out at the cheeks. Seniors call it the mumps. It matters to us because a skin patch tracked in the desqueezed image will slide when the actor turns their head. First desqueeze at the nominal ratio, then apply a small extra horizontal scale driven by focus distance, usually between 1.93 and 2.0 for a close-up. Lens vendors rarely publish this curve, so we shoot a chart at three focus marks and interpolate. Track and paint in the corrected space and reverse both steps on the way out. When focus pulls hard during the shot, animate the ratio with the pull; a static value will make patches swim near the frame edges.",
  }),
  page("f-distortion-undistort-paint-redistort", {
    title: "Undistort, paint, redistort round trip",
    summary:
      "Paints fixes in flattened space and sends only the repaired patch back through the lens, so untouched pixels are never filtered twice.",
    aliases: ["distortion round trip", "paint in flat space"],
    tags: [T.distortion],
    parameterNames: ["overscanPercent", "filterType"],
    houseMethodFor: ["lens-distortion"],
    body:
      "This is our standard workflow whenever a fix has to follow straight geometry or a track. Undistort the plate with overscan, do the paint, clean plate or projection in that flat space, and then redistort only the patch, with its alpha, back into the original lens space. Merge that patch over the raw plate rather than redistorting the whole frame. Every undistort and redistort resamples the image, and doing both to the full plate softens grain and fine edges by a visible amount; keeping the raw pixels outside the patch avoids that. Use a sharp filter for the warp and check the patch edge at 400 percent for a soft halo. If the overscan is too small the redistorted patch will have black corners, so start at 10 percent on wide lenses and trim down after.",
  }),
  page("f-distortion-grid-solve", {
    title: "Solving lens grids shot on the day",
    summary:
      "Builds a per-lens distortion profile from the checkerboard grid the camera team shoots, falling back to plate lines when no grid exists.",
    aliases: ["grid solve", "lens chart calibration"],
    tags: [T.distortion],
    parameterNames: ["gridSquareSize", "focusDistance"],
    body:
      "The camera team should shoot a flat checkerboard for every lens on the show, filling the frame, at the focus distances they actually used. Load the grid, detect the corners and solve a radial model; a residual under 0.3 pixels is good, anything above one pixel usually means the chart was not flat or was shot at an angle. Save the profile under the lens serial and focus mark, not just the focal length, because two copies of the same prime can differ. When the grid is missing, you can still solve from the plate by drawing along lines you know are straight in reality, such as door jambs and window sills, though you need at least four or five lines spread across the frame. Curved architecture or organic locations leave nothing to draw on, and then you borrow a profile from another shot.",
  }),
  page("f-distortion-car-mount-patch-slide", {
    title: "Stopping patch slide on distorted car-mount plates",
    summary:
      "Fixes clean-plate patches that drift across a moving car-mount shot by tracking and projecting in undistorted space.",
    aliases: ["patch drift from distortion"],
    tags: [T.distortion, T.motion],
    parameterNames: ["overscanPercent"],
    shotCodes: ["KY_518_0230"],
    body:
      "A typical complaint: a rig removal on a car-mount shot sticks perfectly at frame centre but slides several pixels as the bodywork passes towards the edge. That is not a bad track, it is lens distortion; a planar track assumes straight lines stay straight, and on a wide lens they do not. Undistort first, track the panel in the flat plate, apply the patch there and redistort only the patch. On a bumpy road, check the focus was not pulled, because the profile changes with focus and the drift will return in waves. The same symptom on a locked-off shot is rare, so if you see slide without camera movement, suspect heat shimmer or rolling shutter instead. For long moves across the full frame, a camera solve with the lens model baked in beats 2D tracking entirely.",
  }),

  // ── vignetting ──
  page("f-vignette-lens-falloff-flatfield", {
    title: "Flat-field removal of lens falloff",
    summary:
      "Divides out the smooth corner darkening of a lens using a shot grey card so sky and set extensions sit evenly across frame.",
    aliases: ["flat fielding", "de-vignette"],
    tags: [T.vignetting, T.sky],
    parameterNames: ["falloffGain", "flatFieldFrame"],
    shotCodes: ["KY_503_0015"],
    body:
      "Natural falloff is the gentle darkening towards the corners that every lens shows wide open, often about one stop at f/1.4 and nearly gone by f/5.6. It only becomes a problem when we add a sky or extend a set, because the new element will be flat while the plate is darker in the corners. Ask for a defocused shot of an evenly lit grey card with the same lens and stop. Blur it heavily, normalise it so the centre equals 1.0, and divide the plate by it in linear light. Do the paint or extension, then multiply the falloff back on before delivery. Without a card, a radial gradient tuned by eye on a clear sky works well enough. It fails when the stop changes during the shot, because the falloff shape and strength change with aperture.",
  }),
  page("f-vignette-matte-box-corners", {
    title: "Repairing matte-box corner cut-off",
    summary:
      "Rebuilds hard dark corners caused by a matte box or flag intruding into frame on a wide lens.",
    aliases: ["matte box vignette"],
    tags: [T.vignetting, T.set],
    parameterNames: ["cornerFeather"],
    shotCodes: ["KY_509_0080"],
    body:
      "Unlike lens falloff, a matte-box vignette has a definite shape: a dark wedge or rounded shadow locked into one or two corners, with an edge that is soft but visibly curved. It happens when the camera team swaps to a wider lens and forgets to bring the matte box in. Because the box is bolted to the camera, the dark area stays fixed in frame whatever the camera does. On a locked-off shot there is no clean information behind it, so the options are a slight push-in to crop it out, if the client accepts the loss, or painting the corner from a clean still. On a pan, rebuild the corner by tracking in image detail from frames where that part of the set was in the clear centre of frame. Match grain afterwards; corners rebuilt from the centre look too sharp.",
  }),
  page("f-vignette-stacked-filters", {
    title: "Mechanical vignette from stacked filters",
    summary:
      "Removes the dark rounded corners left by too many screw-in filters stacked in front of a wide lens.",
    aliases: ["filter ring vignette"],
    tags: [T.vignetting, T.sky],
    parameterNames: ["ringRadius", "edgeSoftness"],
    body:
      "When two or three ND and polarising filters are screwed together on a wide lens, the metal rings start to show as dark arcs in all four corners at once. The shape is a near circle centred on the frame, tighter and harder than optical falloff, and it gets worse as you stop down because the edge sharpens. On sky plates it looks like a porthole. A grey-card divide will not fix it, because the corners are truly blocked rather than merely dimmer. Mask each corner with a circle matching the ring radius, feathered to about 30 pixels, and fill from a clone offset or a generated sky gradient. Drone and travel units are the usual source. If the arc reaches into the action, the honest answer is a slight scale-up and crop.",
  }),
  page("f-vignette-moving-camera-stitch", {
    title: "Falloff removal before stitching a pan",
    summary:
      "Strips vignetting from each frame of a pan before building a clean plate, so the stitched plate has no dark bands.",
    aliases: ["de-vignette for stitching"],
    tags: [T.vignetting, T.motion],
    parameterNames: ["falloffGain"],
    shotCodes: ["KY_521_0060"],
    body:
      "When you build a clean plate by stitching frames from a pan or a slow push, the vignette travels with the camera, so every borrowed patch carries its own darkened edge. Stitch them together and you get soft dark bands at regular intervals across the clean plate, often only visible once it is graded. The fix is to remove the falloff from each frame before stitching, using a card shot or a radial gradient matched to a frame of plain wall, then stitch, then reapply the falloff when projecting the clean plate back through the move. Check by toggling the stitched plate with a heavy grade on top. A locked-off shot never needs this, because the clean plate and the plate share exactly the same vignette. Zooms are harder; the falloff strength changes through the zoom.",
  }),
  page("f-vignette-film-scan-gate", {
    title: "Gate falloff on scanned film plates",
    summary:
      "Evens out corner darkening on film scans, where lens, gate and scanner illumination each add their own falloff.",
    aliases: ["scan illumination correction"],
    tags: [T.vignetting, T.grain],
    parameterNames: ["falloffGain", "grainRestore"],
    body:
      "Film plates stack three kinds of falloff on top of each other: the taking lens, the camera gate, and the scanner's own lamp, which can be uneven across a reel. The scanner part does not change from shot to shot on a reel, so check the scanned leader or a flat frame from the head of the roll and build a correction for that reel first. The lens part you handle as on digital. Be careful with gain in the corners: film grain is already coarse in the shadows, and lifting a corner by a stop makes the grain look visibly heavier there than in the centre. Degrain the corner, lift it, then regrain to match the centre. If the corners are almost black on the negative, there is nothing to recover and a crop is the only answer.",
  }),

  // ── rolling shutter ──
  page("f-rolling-shutter-pan-skew", {
    title: "Unskewing verticals on fast pans",
    summary:
      "Straightens verticals that lean during a fast pan by shifting each image row according to the sensor readout time.",
    aliases: ["skew correction", "leaning verticals fix"],
    tags: [T.rollingShutter, T.motion],
    parameterNames: ["readoutTime", "skewAmount"],
    shotCodes: ["KY_526_0310"],
    body:
      "A rolling-shutter sensor reads the frame from top to bottom, so on a fast pan the bottom rows are captured later than the top and every vertical leans, like a lamppost tipping in the direction of travel. It looks like a shear, not a bend, as long as the pan speed is steady. Track horizontal motion to get pixels per frame, multiply by the readout time as a fraction of the frame, typically 15 to 25 milliseconds at 24 frames, and shear each row by the opposite amount. Check against a known vertical such as a door edge. When the pan speeds up or stops within a frame, the lean becomes a curve, and a plain shear will leave a bend you must correct with a row-by-row warp. Whip pans with heavy motion blur usually hide the skew anyway.",
  }),
  page("f-rolling-shutter-jello-car-rig", {
    title: "Calming jello wobble from a vibrating rig",
    summary:
      "Removes the rubbery wobble that engine vibration causes on rolling-shutter sensors mounted to a vehicle.",
    aliases: ["jello removal", "wobble fix"],
    tags: [T.rollingShutter, T.car],
    parameterNames: ["warpDensity", "smoothingFrames"],
    shotCodes: ["KY_530_0090"],
    body:
      "Jello is what rolling shutter does with vibration rather than with a pan: the camera shakes faster than one frame, so different bands of the image are displaced in different directions and the whole picture seems to ripple like jelly. It is common on hood and door mounts at idle, where the engine rattles the rig. A normal stabiliser cannot fix it, because it only moves the whole frame. Run a dense track across the frame, fit a per-row displacement curve, and warp each row back into line, usually with 16 or more bands. Then stabilise the result gently. Paint any rig removal only after the jello is gone, or the patch will wobble against the plate. It fails where the car body fills most of the frame, as there is nothing static to measure against.",
  }),
  page("f-rolling-shutter-flash-bands", {
    title: "Repairing partial flash bands",
    summary:
      "Fixes frames where a camera flash lit only the top or bottom part of the image, leaving a hard bright band.",
    aliases: ["half-frame flash fix"],
    tags: [T.rollingShutter, T.set],
    parameterNames: ["bandLine"],
    shotCodes: ["KY_534_0025"],
    body:
      "On press-conference and red-carpet scenes, background photographers fire flashes, and with a rolling-shutter camera a flash often lands mid-readout. The result is a frame where the lower half is brightly lit and the upper half is normal, split by a sharp horizontal line, with the next frame often showing the other half lit. Decide first whether the director wants the flash at all. If it stays, combine the two partial frames into one fully lit frame and drop the other. If it goes, find the band line, and for the bright part either borrow from the neighbouring frame with a tracked patch or grade it down to match, using a feathered split of a few rows. Grading down works only when the flash did not blow out detail; clipped skin has to be replaced.",
  }),
  page("f-rolling-shutter-bent-blades", {
    title: "Bent rotor blades on a locked-off camera",
    summary:
      "Replaces propellers, fan blades or wheel spokes that the rolling shutter has bent into curved shapes even with a still camera.",
    aliases: ["curved propeller fix"],
    tags: [T.rollingShutter, T.car],
    parameterNames: ["bladeCount", "blurAngle"],
    body:
      "Rolling shutter is not only a camera-movement problem. With the camera locked off, anything spinning fast, such as a propeller, a cooling fan or wheel spokes on a car, is captured at a different angle on every row, so straight blades appear curved or even detached from the hub. The rest of the frame is fine, which is how you tell it apart from skew. You cannot unwarp it, because each blade has its own motion. The usual fix is to paint out the blades in a tracked shape and replace them with a radial motion blur disc, or a simple rendered blade set, matched in colour to the original. For wheels, a clean spoke pattern rotated and blurred to the road speed is normally enough. Check that the replacement still shows the correct direction of rotation.",
  }),
  page("f-rolling-shutter-aerial-wobble", {
    title: "Aerial plate wobble from rotor vibration",
    summary:
      "Flattens the wavy horizon and rippling rooftops caused by rotor vibration on drone and helicopter plates.",
    aliases: ["drone jello", "horizon ripple fix"],
    tags: [T.rollingShutter, T.sky],
    parameterNames: ["warpDensity", "readoutTime"],
    shotCodes: ["KY_538_0140"],
    body:
      "On aerial plates the horizon sometimes ripples slowly across the frame instead of staying straight, and rooftops shimmer as if underwater. That is rotor vibration getting past a worn gimbal damper, read out by a rolling shutter. It looks similar to vehicle jello but usually has a steadier, lower frequency tied to rotor speed. Because the sky carries no detail, track on the ground and along the horizon, fit a row-by-row offset, and warp. The horizon is your best check; stretch a straight guide across it and scrub. Do this before any sky replacement, or the new sky will sit flat while the ground wobbles below it. Where the ground is water, which gives no reliable track, fall back to reshaping the horizon line by hand and accept small residual movement lower down.",
  }),

  // ── flicker ──
  page("f-flicker-mains-locked-off", {
    title: "Mains-light flicker on locked-off plates",
    summary:
      "Removes the regular brightness pulsing from discharge lights running on mains power by applying a measured per-frame gain.",
    aliases: ["deflicker", "mains hum removal"],
    tags: [T.flicker, T.set],
    parameterNames: ["sampleRegion", "gainCurve"],
    shotCodes: ["KY_540_0050"],
    houseMethodFor: ["flicker"],
    body:
      "Discharge and cheap fluorescent fixtures pulse at twice the mains frequency, and when the shutter does not divide evenly into that rate the plate beats slowly brighter and darker, typically a cycle every few frames. On a locked-off camera this is the easy case. Pick a sample region on a flat wall lit by the offending fixture, away from actors, and measure mean luminance per frame. Divide a smoothed version of that curve by the raw one and apply the result as a per-frame gain to the whole plate. If only part of the room is lit by the flickering source, apply the gain through a soft matte for that area. Check by scrubbing a difference against a frame average. It fails when daylight and mains light mix on the same surface, since only one component pulses.",
  }),
  page("f-flicker-mains-tracking-shot", {
    title: "Deflickering mains hum on a tracking shot",
    summary:
      "Measures and removes mains-light flicker when the camera is moving, using a tracked sample region and a low-pass luminance curve.",
    aliases: ["moving camera deflicker"],
    tags: [T.flicker, T.motion],
    parameterNames: ["sampleRegion", "smoothingFrames"],
    shotCodes: ["KY_544_0170"],
    body:
      "With a moving camera, a fixed sample box picks up changing content, and the curve you measure mixes real flicker with ordinary changes in what the box sees. Track the sample region to a surface lit by the flickering fixture, ideally a plain wall or floor, and hand off to a second surface when the first leaves frame. Then separate the slow change from the fast pulse: low-pass the luminance curve over about nine frames and treat only the difference as flicker. Apply the inverse as a gain. Watch for exposure or iris changes by the camera team, which are slow and must stay. On dolly shots through several rooms, each lit differently, split the shot and deflicker each section separately, overlapping by a few frames and blending the gain curves where they meet.",
  }),
  page("f-flicker-time-lapse-exposure", {
    title: "Smoothing exposure steps in time-lapse",
    summary:
      "Evens out the frame-to-frame brightness jumps in time-lapse plates caused by inconsistent aperture and automatic exposure.",
    aliases: ["time-lapse deflicker"],
    tags: [T.flicker, T.sky],
    parameterNames: ["smoothingFrames", "histogramMatch"],
    body:
      "Time-lapse flicker is not periodic. Each frame is a separate still, and the lens aperture never stops down exactly the same way twice, so frames jump randomly by a tenth of a stop or more. Automatic exposure over sunrise or sunset makes it worse with occasional larger steps. Measure mean brightness per frame over the whole image, excluding the sky if clouds move fast, fit a smooth curve through it over fifteen to twenty-five frames, and gain each frame to the curve. Histogram matching to the smoothed neighbours works better when contrast also jumps. Do this before any sky replacement or cleanup, or patches taken from one frame will not match the next. It cannot fix frames where cloud shadow really does sweep across the landscape; keep the smoothing window long enough not to flatten those.",
  }),
  page("f-flicker-screen-in-shot", {
    title: "Steadying a pulsing screen in shot",
    summary:
      "Fixes monitors, phones and LED panels in frame that pulse or show rolling dark bars because their refresh rate disagrees with the camera.",
    aliases: ["monitor flicker fix", "screen refresh bars"],
    tags: [T.flicker, T.set],
    parameterNames: ["refreshRate"],
    shotCodes: ["KY_548_0035"],
    body:
      "A screen in shot often flickers or shows a dark bar rolling slowly up through it. The screen refreshes at its own rate, and the camera samples it at a different one, so you see the beat between them. Only the screen is affected, which separates this from mains flicker on the whole room. When the screen content is going to be replaced anyway, just track the screen corners and insert new content, adding back reflections from the original glass. When the content must stay, sample a clean frame where the bar is off screen, track it in, and use it for the frames with the bar, cross-fading if the content animates. LED panels used as set lighting are harder, since their pulse lights faces and walls too; treat that spill with a gain through a matte.",
  }),
  page("f-flicker-firelight-keep", {
    title: "Painting patches under living firelight",
    summary:
      "Transfers the wanted flicker of fire or candlelight onto painted patches so fixes do not sit static in a flickering scene.",
    aliases: ["flicker matching"],
    tags: [T.flicker, T.night],
    parameterNames: ["lightCurve", "patchGain"],
    shotCodes: ["KY_552_0210"],
    body:
      "In campfire and candlelit scenes the flicker is the point, so we never deflicker. The trap is the paint work inside those scenes: a clean-plate patch built from one frame stays at one brightness while the surrounding area breathes with the flames, and viewers notice a dead spot straight away. Measure the light curve on a surface next to your patch, lit by the same fire, and normalise it to the frame your patch came from. Multiply the patch by that curve, and if the fire colour shifts warmer when it flares, measure per channel. Patches far from the fire need a gentler curve, since the flicker falls off with distance. It fails for moving shadows cast by the flames; there you have to animate the patch shape or project a rebuilt surface with the plate lighting on top.",
  }),
  page("f-flicker-film-density", {
    title: "Density pumping on film-scan plates",
    summary:
      "Removes the frame-to-frame density breathing in scanned film, measured and corrected per colour channel.",
    aliases: ["film breathing fix"],
    tags: [T.flicker, T.film],
    parameterNames: ["channelGain", "smoothingFrames"],
    body:
      "Older cameras and tired processing baths can leave film plates that pump gently in density, and unlike digital mains flicker the three dye layers do not always move together, so the shot also shifts slightly in colour from frame to frame. Check each channel separately on a neutral area: if red and blue curves differ, correct per channel, not with one overall gain. Work on log scan data, where a density change is a simple offset, then convert. Smooth over five to seven frames; film pumping is slower and softer than mains beating. Grain is the other trap, since a luminance measure on a small area is noisy, so use a large sample region or degrain a copy just for measuring. Flicker that comes from shutter problems on the day will be periodic and is better handled like mains flicker.",
  }),

  // ── chromatic aberration ──
  page("f-ca-lateral-edge-fringes", {
    title: "Realigning lateral colour fringes",
    summary:
      "Removes red and blue edge fringes near the frame border by scaling the colour channels back into register with green.",
    aliases: ["lateral CA fix", "channel scale realign"],
    tags: [T.aberration, T.set],
    parameterNames: ["redScale", "blueScale"],
    shotCodes: ["KY_556_0075"],
    body:
      "Lateral chromatic aberration shows as thin coloured outlines, usually red on one side of a high-contrast edge and cyan or blue on the other, growing stronger towards the corners and vanishing at frame centre. It happens because the lens magnifies each wavelength slightly differently. Because it is a scale difference, a scale fixes it: hold green still and scale red and blue about the optical centre, typically by values like 1.0006 or 0.9995, until a black-on-white edge near the corner goes neutral. Zoom in to 400 percent on a window frame or sign edge. Remember the optical centre is not always the image centre if the sensor is offset or the shot is reframed. If the fringe does not scale away, it is probably longitudinal aberration or purple fringing, which need different handling.",
  }),
  page("f-ca-longitudinal-bokeh", {
    title: "Taming green and magenta bokeh fringes",
    summary:
      "Reduces the colour fringes that appear on out-of-focus edges in front of and behind the focal plane.",
    aliases: ["axial CA fix", "bokeh fringe removal"],
    tags: [T.aberration],
    parameterNames: ["fringeHue", "desatAmount"],
    body:
      "Longitudinal aberration is the fast-lens fringe that appears anywhere in frame, including the centre, but only on out-of-focus material. Edges in front of the focal plane pick up a magenta tint and edges behind it turn green, so a defocused fence behind an actor glows green while a blurred glass in the foreground glows purple. Scaling channels does nothing here, because the colours are not displaced, they are blurred by different amounts. Instead, key the fringe hue in a narrow range, restrict it to soft edges with an edge-detect matte, and desaturate towards the neighbouring colour. Going beyond about 70 percent desaturation makes grey outlines. It is worst at wide open apertures, so ask camera whether a stop was used. On highlights that clip, the fringe colour merges with purple fringing; treat those separately.",
  }),
  page("f-ca-purple-highlight-fringe", {
    title: "Removing purple fringing around blown highlights",
    summary:
      "Cleans the purple halo that forms where clipped highlights meet dark detail, such as sky seen through branches.",
    aliases: ["purple fringe removal"],
    tags: [T.aberration, T.sky],
    parameterNames: ["clipThreshold", "fringeHue"],
    shotCodes: ["KY_560_0130"],
    body:
      "Purple fringing sits on the dark side of edges next to clipped highlights: bare branches against a bright overcast sky, chrome trim in sunlight, a window from inside a dim room. It is a mix of lens and sensor behaviour, and it only appears where something is blown out, which is the easiest way to recognise it. Build a matte from pixels above the clip threshold, grow it by a few pixels, and intersect it with a hue key on violet and purple. Within that area pull saturation down and shift hue towards the surrounding foliage colour. For sky replacement under branches, clean the fringe first, or the new sky will sit behind a purple outline. It fails on genuinely purple subjects such as flowers or costumes, so check the hue range carefully and hold them out with roto.",
  }),
  page("f-ca-before-green-screen-key", {
    title: "Correcting lateral colour before a screen pull",
    summary:
      "Realigns colour channels before keying so fringes do not confuse the keyer, then puts the fringe back on the finished composite.",
    aliases: ["pre-key CA removal"],
    tags: [T.aberration, T.green],
    parameterNames: ["redScale", "blueScale"],
    shotCodes: ["KY_564_0045"],
    body:
      "On a green screen, a red-blue fringe on the edge of an actor makes the keyer see a thin band that is neither screen nor foreground, so you get a dark or coloured line around the shoulders and fly-away hair, worst near the corners of frame. Before pulling the key, scale red and blue into register with green, judged on a sharp edge against the screen near the frame edge. Pull the key on the corrected plate, composite, and then reapply the same aberration to the finished composite so the whole frame has consistent lens character. If you skip that last step, the foreground looks oddly clean against a background plate that still has fringes. Hair detail is the acid test. On soft anamorphic edges the fringe is partly longitudinal and channel scaling will only get part of it.",
  }),
  page("f-ca-reapply-after-paint", {
    title: "Putting fringes back on painted patches",
    summary:
      "Adds matching chromatic aberration to painted or rebuilt areas near the frame edge so they sit in the lens like the rest of the plate.",
    aliases: ["CA matching", "fringe reintroduction"],
    tags: [T.aberration, T.set],
    parameterNames: ["redScale", "blueScale"],
    body:
      "Paint and clean plate work near the frame edge often comes out too clean: a rebuilt window frame or door edge has perfectly registered channels, while the real edges beside it carry red and cyan outlines. In review it reads as a patch even when the shape and grain are right. The cure is to measure the plate's fringe on an untouched edge at the same distance from the optical centre and apply the same channel scale to the patch only. Keep the patch alpha from the green channel so the merge edge does not pick up its own colour line. In the centre of frame this step barely matters. If the team has already removed aberration from the whole plate for tracking, then paint on that corrected plate and reapply the fringe once at the end instead.",
  }),
  page("f-ca-night-streetlights", {
    title: "Colour fringes on night streetlights",
    summary:
      "Cleans coloured halos and split-colour edges around point light sources in night exteriors shot wide open.",
    aliases: ["night light fringe fix"],
    tags: [T.aberration, T.night],
    parameterNames: ["clipThreshold", "redScale"],
    shotCodes: ["KY_568_0260"],
    body:
      "Night exteriors are shot wide open, so every aberration is at its worst, and streetlights, headlamps and lit windows are bright point sources against black. Near the corners they show a lateral split, red on one side and blue on the other, and the clipped cores sprout purple halos. Handle the two separately. First correct the lateral part with a channel scale as you would in daylight, checking on a lamp near the corner rather than on an edge. Then treat the purple halo with a clip matte and hue key. Do not desaturate the warm glow of sodium lamps; that glow is real and belongs to the scene. In rain or mist the halos spread and blend with real atmosphere, and cleaning them too hard makes the lights look stuck on, so favour a light touch there.",
  }),

  // ── moiré ──
  page("f-moire-striped-shirt-locked", {
    title: "Killing moiré on a striped shirt",
    summary:
      "Removes the rainbow wave pattern on finely striped or woven clothing in a locked-off shot with a band-limited blur inside a tracked matte.",
    aliases: ["fabric moire removal"],
    tags: [T.moire],
    parameterNames: ["blurSize", "grainRestore"],
    shotCodes: ["KY_572_0020"],
    body:
      "Moiré on clothing looks like soft curved bands, often with a rainbow tint, floating across a shirt or jacket with a fine stripe or weave. It comes from the fabric pattern being close to the sensor's pixel spacing. On a locked-off interview, where the actor barely moves, the bands are nearly static and the fix is fairly simple. Roto the garment, leaving out skin and buttons, and inside the matte blur just enough to remove the pattern frequency, usually two to four pixels, then rebuild some fabric texture with a gentle sharpen or a tiled texture from a clean area. Desaturate any rainbow tint. Restore grain last so the garment does not look smeared. If the client needs the stripes kept, rebuild the stripe pattern as a tracked texture; blurring will lose them entirely.",
  }),
  page("f-moire-costume-handheld", {
    title: "Moiré crawling on a moving costume",
    summary:
      "Controls moiré that shifts and crawls over a costume as the actor walks and the handheld camera follows.",
    aliases: ["crawling fabric moire"],
    tags: [T.moire, T.motion],
    parameterNames: ["blurSize", "trackPoints"],
    body:
      "When both actor and camera move, fabric moiré no longer sits still; the bands race and crawl over folds and change direction as the cloth bends, which is far more distracting than the static version. A single garment matte with a blur will smear the folds and the shading with them. Break the costume into regions that move together, such as sleeves, chest and back, and track each one. Separate the shading from the texture first, by blurring a copy heavily to keep the shading, then remove the pattern in the detail layer only and recombine. A temporal median over three frames, motion-compensated, helps on slow moves. Fast handheld frames with heavy blur usually hide the moiré anyway, so focus effort on the frames where the camera settles.",
  }),
  page("f-moire-monitor-screens", {
    title: "Removing pixel-grid moiré from monitors",
    summary:
      "Removes the moving wave patterns caused by a screen's pixel grid beating against the camera sensor.",
    aliases: ["screen moire fix"],
    tags: [T.moire, T.set],
    parameterNames: ["blurSize"],
    shotCodes: ["KY_576_0105"],
    body:
      "Computer and phone screens in shot often carry a strong rippling pattern, sometimes coloured, that shifts as the camera moves. The screen's pixel grid and the sensor's grid are interfering, and it shows most when the screen is in sharp focus. If the screen is getting new content, the moiré disappears with the replacement: track the corners, insert the graphic, and add back reflections from the glass. If the original content must stay, a directional blur along the grid axes, kept within a tracked screen matte, usually clears it, followed by a touch of sharpening on the text. Rotated screens need the blur rotated to match. If the screen also pulses or shows a rolling bar, that is a refresh problem rather than moiré and needs a separate fix before this one.",
  }),
  page("f-moire-brick-facade-wide", {
    title: "Shimmering brick on wide facade shots",
    summary:
      "Calms the shimmer that fine brick courses, roof tiles and cladding create on wide establishing shots of buildings.",
    aliases: ["facade shimmer fix", "brick moire"],
    tags: [T.moire, T.set],
    parameterNames: ["blurSize", "detailMix"],
    shotCodes: ["KY_580_0010"],
    houseMethodFor: ["moire"],
    body:
      "On wide establishing shots, regular building surfaces such as brick courses, roof tiles and siding become so small that they approach pixel size, and they shimmer or form curving bands across the wall. The building is static, so on a locked-off shot you can build one clean frame and hold it. Take a median of twenty or so frames to remove the movement of the bands, roto the affected walls, and rebuild the texture from a sharper area of the same facade, scaled down with a good filter. Track that clean surface over the plate through a soft matte and add grain. On a moving camera use a projection of the cleaned frame instead. It fails when people or traffic pass in front of the facade; roto them out of the clean layer and put them back over it.",
  }),
  page("f-moire-glass-tower-drone", {
    title: "Window-grid moiré on a drone flyover",
    summary:
      "Removes the shimmering curved bands that glass towers and window grids produce on moving aerial plates.",
    aliases: ["curtain wall moire"],
    tags: [T.moire, T.motion, T.sky],
    parameterNames: ["projectionFrame", "blurSize"],
    shotCodes: ["KY_584_0150"],
    body:
      "Glass towers with tight mullion grids are a classic source of moiré on aerial plates: as the drone moves, large bright and dark bands sweep across the facade and the building seems to breathe. Unlike brick on a locked-off wide, the pattern changes every frame and nothing can be held still. Solve the camera, build a simple box for the tower, and project a cleaned frame onto it, ideally from the closest point of the flight where the grid is resolved rather than aliased. Reflections of sky and clouds in the glass must move correctly, so put them back as a separate layer from the original plate after a strong blur. If the solve is weak, fall back to heavy directional blur along the grid lines within a tracked matte, which softens the tower but stops the breathing.",
  }),
  page("f-moire-car-grille", {
    title: "Moiré on a car grille in motion",
    summary:
      "Fixes the shifting interference pattern on fine mesh grilles and vents of cars as they drive past or towards camera.",
    aliases: ["grille shimmer fix"],
    tags: [T.moire, T.car],
    parameterNames: ["meshScale", "grainRestore"],
    body:
      "Mesh grilles and fine vents are small repeating patterns that alias badly as a car approaches camera, because their size in frame changes constantly and the interference pattern sweeps through several shapes in a second. Product shots for car clients get extra scrutiny here. Track the grille with a planar track, which holds well because the grille is flat and rigid, and replace it with a clean mesh, either photographed or built from a hero frame where the mesh reads clearly. Scale the mesh to match the tracked size and filter it when scaled down so the new grille does not alias in turn. Add the reflections and highlights back from the plate with a blurred screen layer. It gets difficult when the grille is partly shadowed or wet, as the lighting variation must be carried over.",
  }),

  // ── sensor dust and dead or hot pixels ──
  page("f-sensor-dust-fixed-spot", {
    title: "Same-spot sensor dust across a sequence",
    summary:
      "Removes a soft dark spot that sits at the same frame position in every shot from one camera body, using one reusable fix.",
    aliases: ["sensor spot removal", "dust bunny fix"],
    tags: [T.sensorDust, T.sky],
    parameterNames: ["spotRadius", "spotDensity"],
    shotCodes: ["KY_588_0030", "KY_588_0040"],
    houseMethodFor: ["sensor-dust"],
    body:
      "Dust on the sensor cover glass shows as a soft, roundish dark smudge, most visible on plain sky when the lens is stopped down past f/8. The giveaway is that it never moves: pan, tilt or cut to another shot from the same camera and it stays on the same pixel coordinates. That lets us fix a whole sequence at once. Measure the spot on a flat sky frame, model it as a soft radial darkening, and divide it out, which keeps the texture underneath. Save the position and strength with the camera body and date, so other vendors and later shots can use it. Wide open the spot becomes almost invisible, so shots at f/2 may need nothing. If the camera was cleaned mid-shoot, split the sequence at that point and check both halves.",
  }),
  page("f-sensor-dust-front-filter", {
    title: "Soft blobs from dust on a front filter",
    summary:
      "Removes large faint blobs caused by dust or water spots on a filter in front of the lens, which shift with zoom and filter rotation.",
    aliases: ["filter dust removal"],
    tags: [T.sensorDust, T.sky],
    parameterNames: ["spotRadius", "trackPoints"],
    shotCodes: ["KY_592_0115"],
    body:
      "Dust and drying water marks on a front filter look at first like sensor dust, but they are bigger, fainter and more irregular, sometimes with a bright rim, because they are far out of focus. They also behave differently: they grow or shrink when the lens zooms, they change with focus, and if the filter is a rotating polariser they swing round when the operator turns it. So a single fixed fix from the sensor dust workflow will not hold. Track or keyframe each blob through the shot, matching its size as the zoom changes, and divide out its darkening as for sensor spots. On busy backgrounds use a clone from a nearby frame instead. Very large blobs on wide lenses can cover a tenth of the frame, and then a gradient correction works better than spot removal.",
  }),
  page("f-hot-pixels-night-exterior", {
    title: "Clearing hot pixels in night exteriors",
    summary:
      "Removes the bright single-pixel red, green or blue dots that warm sensors produce in long or high-gain night exposures.",
    aliases: ["hot pixel removal"],
    tags: [T.deadPixels, T.night],
    parameterNames: ["outlierThreshold", "filterRadius"],
    shotCodes: ["KY_596_0280"],
    body:
      "Hot pixels are single bright dots, often saturated red, green or blue, sprinkled over the dark parts of night plates. They come from a warm sensor working at high gain, and get worse in long takes as the camera heats up, so you may find more at the end of a shot than at the start. They are fixed to sensor positions and are easy to miss against city lights until the grade lifts the shadows. Detect them by comparing each pixel with the median of its neighbours, flagging anything several times brighter, and only where the pixel stays bright over many frames; that stops you removing real distant lights. Replace flagged pixels with the neighbourhood median. After a debayer, a hot pixel can smear to a small cluster, so use a 3x3 footprint.",
  }),
  page("f-dead-sensor-column", {
    title: "Rebuilding a dead sensor column",
    summary:
      "Repairs a full-height line of dead or stuck pixels by interpolating it from the columns on either side.",
    aliases: ["dead line fix", "bad column repair"],
    tags: [T.deadPixels],
    parameterNames: ["columnIndex", "interpolationWidth"],
    body:
      "A failing sensor can lose an entire column or row, which appears as a thin vertical or horizontal line running the full height or width of the frame, either dark, bright or a constant colour, on every frame at the same position. It is unmistakable once you see it, but on busy plates it hides until the client spots it on a large screen. Find the exact column index by looking at a flat area at 800 percent. Rebuild it by interpolating from neighbours, using two pixels on each side for a smoother result. Grain will be missing along the line, so add a thin strip of matched grain. It fails on fine vertical detail that runs parallel to the column, such as railings or rigging, where you need to clone or paint by hand.",
  }),
  page("f-stuck-pixels-day-pan", {
    title: "Finding stuck pixels in bright day plates",
    summary:
      "Detects and removes stuck pixels that hide in bright daylight plates by looking for points that stay still while the image moves.",
    aliases: ["stuck pixel detection"],
    tags: [T.deadPixels, T.motion],
    parameterNames: ["outlierThreshold", "motionThreshold"],
    shotCodes: ["KY_599_0065"],
    body:
      "In bright day plates, stuck pixels hardly show because their value is similar to the image around them, and they only give themselves away in shadows or on a dark car or doorway drifting past. On a panning shot there is a neat way to find them: everything in the image moves except the stuck pixel. Stabilise on the scene, then look at a per-pixel variance over time in the original frame space; a pixel with almost no variance while its neighbours change a lot is stuck. On a locked-off plate this test is useless, because everything static has low variance, so there you compare against a dark frame from the same camera. Replace flagged pixels with a median of their neighbours. Keep the list, since the same pixels will recur on every shot from that camera.",
  }),
  page("f-scan-dust-vs-sensor-dust", {
    title: "Telling scan dust from sensor dust",
    summary:
      "Sorts spots on a plate into film dirt, scanner dust and sensor dust by how they move, so each gets the right fix.",
    aliases: ["dust triage"],
    tags: [T.dust, T.sensorDust, T.film],
    parameterNames: ["spotRadius"],
    body:
      "Before removing spots, work out where they come from, since each source has a different cheap fix. Dirt on a film negative appears for a single frame at a random place and, after inversion, shows as a bright white speck with a sharp edge. Scanner dust sits on the scanner glass, so it stays in one place across a run of frames and may appear across several shots on the same reel, usually soft and dark. Sensor dust only exists on digital plates, stays fixed for a whole shoot, and changes in strength with aperture. Film dirt needs a per-frame automatic dust buster with manual checking. Scanner dust can be fixed once per reel, and often the scan can be redone instead. Sensor dust gets a single stored fix per camera. Scratches that run along several frames are another case again.",
  }),
];
