/**
 * Held-out search quality pages: a held-out set written apart from the engine (2026-12-04).
 * These are invented Kestrel Yard technique pages that the project's own tuning never saw, grouped
 * in look-alikes (people and vehicle removal, wires and rigs, grain, dust and pixels, film damage,
 * reflections, flicker, lens problems, screens, logos and devices, skin, sky and water, camera
 * motion, compression). Never tune on it. Trade content is common practice, no published source.
 */
import type { SearchDocument } from "@/lib/search/types";
import { pageMaker, tag, TAGS } from "./pages";

/** One problem tag the shared TAGS list does not have: fixed objects that are not people or crew. */
const UNWANTED = tag("unwanted-objects", "Unwanted objects", "problem", ["object removal", "vehicle removal"]);

const page = pageMaker("up");

const T = TAGS;

export const UNSEEN_PAGES: SearchDocument[] = [
  // ── People and vehicles out of shot ──────────────────────────────────────────
  page("u-clean-plate-locked-off", {
    title: "Clean-plating people out of a locked-off shot",
    summary: "When the camera does not move, lift clean background from frames where the walkers have gone and hold it over them.",
    aliases: ["static camera people removal", "frame borrow"],
    tags: [T.crew, T.set],
    parameterNames: ["sourceFrame", "featherSize"],
    shotCodes: ["KY_104_0020"],
    houseMethodFor: ["crew-in-shot"],
    body:
      "A crew member or passer-by walks through the background of a tripod or locked-off shot. Because nothing in the frame moves apart from the person, scrub for a frame where the area behind them is clear, or use the clean pass if the camera team shot one, and hold that frame over the person with a soft-edged roto shape. Check the light: a passing cloud or a practical changing level means the borrowed frame needs a grade per frame to sit in. This fails as soon as the camera drifts even a pixel, so run a quick track first and stabilise if there is any float. If the person casts a shadow or touches foreground action, the patch has to be broken up around the contact.",
  }),
  page("u-moving-camera-people-removal", {
    title: "Projecting a clean patch to remove people on a moving camera",
    summary: "On a pan, dolly or handheld move, track the camera and project a cleaned frame onto simple geometry so the patch sticks to the background.",
    tags: [T.crew, T.motion],
    body:
      "When the camera is moving, a frame borrowed from elsewhere in the shot no longer lines up, and a person walking past in the background cannot simply be covered. Solve the camera, paint one frame clean by hand, and project that frame onto cards or rough geometry placed where the walls and ground are. For flat surfaces a planar track and a corner-pinned patch is often enough. Parallax is where it fails: if the person passes in front of things at different depths, one card slides against the other, so split the patch by depth. Add grain back and check the edges over the whole move, not just the paint frame.",
  }),
  page("u-crowd-thinning", {
    title: "Emptying a busy street by stacking offset frames",
    summary: "For many pedestrians or a crowd on a static shot, a median of many frames gives back the empty street under them.",
    aliases: ["median stack", "crowd removal"],
    tags: [T.crew, T.set],
    parameterNames: ["frameCount", "frameStep"],
    shotCodes: ["KY_210_0040"],
    body:
      "A locked-off street has a steady flow of tourists or extras and the brief is an empty town. Painting each person out is hopeless, so take a spread of frames across the shot, align them, and take the median value per pixel: anything that moves through stays in fewer than half the frames and drops out. People who stand still, such as someone waiting at a crossing, survive the median and need a hand patch. Lighting changes across a long take leave a soft smear, so stack fewer frames closer together if the sun moves. The result is a still, so reintroduce grain and any small life such as leaves moving.",
  }),
  page("u-parked-car-removal", {
    title: "Removing a parked car and rebuilding the kerb behind it",
    summary: "Take a modern or wrongly placed vehicle out of a period street and rebuild the road, kerb and wall it hid.",
    aliases: ["vehicle removal", "car paint-out"],
    tags: [UNWANTED, T.car, T.set],
    body:
      "A parked car sits in a street that should be empty or period-correct. Unlike a passer-by it never moves, so there is no clean frame to borrow; the kerb, road markings and wall behind it have to be built from pieces of the same plate. Clone the kerb line along from either side, keep road lines straight with a guide, and match the wear and dirt so the patch does not look newer than its neighbours. Remember the car's shadow and any reflection of it in windows or puddles. On a moving camera, paint one frame and track or project it.",
  }),

  // ── Wires and rigs ───────────────────────────────────────────────────────────
  page("u-wire-over-sky", {
    title: "Erasing a thin wire against clear sky",
    summary: "Fill a fine wire over a smooth background by pulling in neighbouring pixels from either side of it.",
    tags: [T.wire, T.sky],
    parameterNames: ["wireWidth", "offsetPixels"],
    body:
      "A fine support wire runs up from a stunt performer or a flown prop against sky, a plain wall or haze. Because the background is smooth, the wire can be filled from pixels a few pixels to either side of it: track or roto the wire as a thin spline and offset the neighbouring area over it. Do the fill in short sections along the wire so gradients in the sky stay smooth. Watch for the wire catching light and glinting on a few frames, which needs a wider patch. The method breaks down as soon as the wire crosses texture or an edge, where the offset fill leaves a visible seam.",
  }),
  page("u-wire-over-detail", {
    title: "Wire removal across brick, foliage and busy detail",
    summary: "Where a wire crosses textured background, rebuild behind it with a tracked clean plate or patches from elsewhere in the frame.",
    tags: [T.wire, T.set],
    body:
      "Once a wire passes in front of brickwork, leaves or a patterned set, an offset fill smudges the texture and the line shows. Get a clean plate if the camera team shot one, or paint a clean frame by hand, and track it onto the background so the texture stays locked. Brick courses and mortar lines need to carry straight through the patch. Leaves that move in the wind cannot be tracked as one surface, so build a few frames and blend across them. Check at full resolution in motion; a slight wobble in texture is more obvious than the wire was.",
  }),
  page("u-rig-arm-behind-actor", {
    title: "Rebuilding costume and body behind a harness or rig arm",
    summary: "When a harness, pick point or rig arm covers part of the performer, rebuild the costume underneath with tracked patches.",
    aliases: ["harness removal", "rig removal on actor"],
    tags: [T.wire, T.skin],
    parameterNames: ["meshWarp", "patchFrames"],
    shotCodes: ["KY_305_0110"],
    houseMethodFor: ["wire-or-rig"],
    body:
      "A flying or falling performer wears a harness with a pick point at the hip or back, or a rig arm holds them from behind, and it shows against the costume. The background may be easy, but the body is not: cloth folds and the silhouette change every frame. Find frames or a reference pass where the costume is visible, and track them on with a mesh warp or several small planar tracks that follow the folds. Rebuild the silhouette edge where the arm or strap crosses it, against whatever is behind. This takes longest when the performer spins, because there is no stable frame to copy from.",
  }),

  // ── Grain and noise ──────────────────────────────────────────────────────────
  page("u-regrain-after-paint", {
    title: "Putting grain back over paint patches",
    summary: "Patches and clean plates look smooth and dead against the live plate until matching grain is laid back over them.",
    tags: [T.grain],
    parameterNames: ["grainSize", "grainIntensity"],
    houseMethodFor: ["grain-and-noise"],
    body:
      "A held or averaged patch has no moving grain, so in playback it looks like a frozen window in the picture even when the colour is right. Degrain the patch source or paint on a degrained plate, then add grain back over the whole repaired area, sampled from the plate itself. Match size and amount per colour channel, since blue usually carries the most. Check in shadows and highlights separately, because grain response changes with brightness. The mistake to avoid is adding grain on top of grain, which makes the patch look busier than the plate.",
  }),
  page("u-denoise-before-key", {
    title: "Denoising a plate for the key, not for the output",
    summary: "Heavy noise makes screen keys chatter, so denoise a copy to pull the matte and keep the original plate for the final.",
    tags: [T.grain, T.green],
    parameterNames: ["denoiseStrength", "temporalFrames"],
    body:
      "Keys pulled on a noisy plate fizz along the edges and the matte crawls in flat screen areas, especially in the blue channel. Run a denoise on a copy of the plate, use it only to generate the matte, and apply that matte to the untouched plate. Temporal denoise is stronger but smears anything moving fast such as hair or hands, so reduce it there. Too strong a denoise softens fine edges and the key loses hair detail, so judge by the matte, not the picture.",
  }),
  page("u-grain-match-between-plates", {
    title: "Matching grain between plates from different cameras",
    summary: "When an element from one camera sits in a plate from another, analyse both grain structures and adjust the element to match.",
    tags: [T.grain],
    body:
      "A foreground shot on one camera is comped over a background shot on a different body or stock, and the two halves of the picture have visibly different texture: one fine and soft, the other coarse and colourful. Degrain the element and regrain it with grain sampled from the background, or add to the weaker plate until both match. Compare in flat areas of the same brightness, and check each channel, because two cameras usually differ most in blue. Scaled elements also scale their grain, so always degrain before a large resize.",
  }),

  // ── Dust, sensor spots, pixels, film damage ──────────────────────────────────
  page("u-film-dust-busting", {
    title: "Dust busting a film scan frame by frame",
    summary: "Single-frame specks of dust and dirt on scanned film are repaired by borrowing the same area from the frame before or after.",
    tags: [T.dust, T.film],
    parameterNames: ["frameOffset", "detectThreshold"],
    shotCodes: ["KY_012_0300"],
    houseMethodFor: ["dust-and-scratches"],
    body:
      "A scanned film plate shows white specks and black flecks that pop on for one frame and are gone on the next; white is usually dirt on the negative, black on a print. Because each speck lives on one frame, the clean picture is there on the neighbours: copy the area from the previous or next frame, motion-compensated if the camera moves. Automatic detection catches most of it but also eats real small things like sparks or rain, so review every hit. Work in playback, since the eye finds dust in motion that a still frame hides.",
  }),
  page("u-sensor-spot-fixed", {
    title: "Painting out sensor spots that sit still in frame",
    summary: "Soft dark blobs in the same screen position all through a digital shot are dirt on the sensor and need a patch that follows the frame, not the scene.",
    tags: [T.sensorDust, T.sky],
    parameterNames: ["spotRadius"],
    body:
      "On a digital camera, dust on the sensor shows as soft grey circles that stay put at one place in frame while the image moves behind them. They show most in bright, even areas like sky, and more on stopped-down lenses. Because the blob does not move with the scene, do not track it to the background; fix it in screen space, and fill it with background borrowed from frames where the scene has slid past. A soft blob can sometimes be lifted with a local gain to match its surroundings rather than painted. Check every shot from the same camera on the same day, as the spot will be on all of them.",
  }),
  page("u-stuck-pixel-fix", {
    title: "Fixing a stuck pixel across a whole shot",
    summary: "A single bright or coloured pixel in the same place on every frame is replaced by the average of its neighbours.",
    aliases: ["hot pixel", "dead pixel"],
    tags: [T.deadPixels],
    parameterNames: ["pixelX", "pixelY", "searchRadius"],
    body:
      "A tiny point of pure red, green, blue or white sits at one position in frame through the whole shot, clearest in dark areas and night plates. It is a faulty photosite, not dirt, so it is sharp-edged and one or two pixels across. Note the coordinates and replace the pixel with the average of the pixels around it, which is invisible at that size. Several can appear across a camera's shots, so keep a list per camera and apply it to everything. A bad pixel that has been through debayering can smear into a small coloured cross, so widen the fix.",
  }),
  page("u-hair-in-gate", {
    title: "Removing a hair in the gate",
    summary: "A hair or fibre caught at the edge of the film gate sits in one place for many frames and wiggles, so it is repaired from clean areas rather than neighbouring frames.",
    tags: [T.dust, T.film],
    body:
      "A thin dark squiggle sits at the edge of frame, usually near a corner, for seconds or a whole take, and twitches slightly. It was a hair or fibre caught in the camera gate, so neighbouring frames have it too and frame borrowing does not help. Rebuild the area from a clean plate or a patch from elsewhere in the same frame, tracked to the camera move. When it sits in shadow or over out-of-focus background, a simple blur and clone is enough. If it drifts in and out, handle each section separately.",
  }),
  page("u-vertical-scratch-film", {
    title: "Repairing a continuous vertical scratch on a film scan",
    summary: "A line running down the frame for many frames is filled from either side, since the neighbouring frames are scratched too.",
    aliases: ["tramline", "scratch repair"],
    tags: [T.dust, T.film],
    parameterNames: ["scratchWidth", "scratchX"],
    body:
      "A thin straight line, bright or dark, runs top to bottom through the picture and stays there across many frames, sometimes wandering a little sideways. It was dug into the film along the camera or projector path, so borrowing from the next frame only moves the problem. Track the line's position, then fill it from pixels to its left and right, using wider texture cloning where it crosses faces or detail. Bright scratches go through to the base and often have coloured edges; dark ones may be on the print. Check in motion, as a half-filled scratch still flickers.",
  }),

  // ── Reflections ──────────────────────────────────────────────────────────────
  page("u-reflection-shop-window", {
    title: "Removing crew reflected in shop windows",
    summary: "Take the camera, crew and lights out of a storefront's glass while keeping the shop interior and the street's reflection.",
    aliases: ["window reflection removal"],
    tags: [T.reflections, T.set],
    parameterNames: ["reflectionOpacity"],
    shotCodes: ["KY_118_0070"],
    body:
      "In a street shot, the camera team, dolly and lamps are visible in a shop window or glass door. The glass shows two layers, the shop interior behind it and the reflected street, and the crew sits in the reflected layer. Rebuild the reflection from a clean area of glass or a reflection plate, blend it at the opacity of the original reflection, and leave the interior untouched. Panes are flat, so a planar track holds well; a door that swings changes the reflection angle every frame and has to be rebuilt as it moves.",
  }),
  page("u-reflection-car-paint", {
    title: "Cleaning camera reflections off car bodywork",
    summary: "Curved, glossy paint on a car wraps the camera and crew into stretched reflections that slide as the car moves.",
    tags: [T.reflections, T.car],
    parameterNames: ["surfaceTrack", "reflectionBlur"],
    body:
      "A hero car's doors and bonnet show a distorted image of the camera car, the tracking vehicle or the crew. Because the bodywork is curved, the reflection is bent and slides across the panels as the car turns, so it cannot be held like a flat pane. Track the panel surface, paint out the unwanted shape and replace it with sky or street reflection stretched the same way. Keep the highlights along the body lines, as those sell the shape of the car. Chrome trim and wheels pick up the crew as well; do not forget them.",
  }),
  page("u-reflection-eyes-glasses", {
    title: "Taking the rig out of reflections in glasses and eyes",
    summary: "Catchlights and spectacle lenses on a close-up show the camera, lights or crew, and are painted back to a clean shape.",
    aliases: ["eyeglass reflection", "catchlight cleanup"],
    tags: [T.reflections, T.skin],
    body:
      "On a close-up, an actor's spectacles show a lighting panel, the camera and an operator, or their eyes mirror the whole set. Glasses lenses can be patched from a clean frame and tracked to the head's movement, keeping a soft neutral reflection so the lens still reads as glass. In eyes, keep a catchlight, because an eye without one looks dead, but simplify it to a clean soft shape. Blinks and head turns break tracks, so split the shot into sections.",
  }),

  // ── Flicker ──────────────────────────────────────────────────────────────────
  page("u-flicker-lights-mains", {
    title: "Deflickering pulsing practical lights",
    summary: "Fluorescent and LED lights pulse when their frequency fights the camera shutter; even the brightness out against a reference frame.",
    aliases: ["light flicker", "shutter beat"],
    tags: [T.flicker, T.set],
    parameterNames: ["referenceFrame", "smoothingWindow"],
    body:
      "Strip lights or cheap LEDs on set beat against the camera's shutter, so the whole picture or the lit areas pulse brighter and darker from frame to frame. Measure average brightness in a few regions across the shot and match each frame to a reference frame or a smoothed curve. If the pulse is also a colour shift, handle each channel separately. Deflicker that is too aggressive flattens real changes such as a door opening, so limit the smoothing window.",
  }),
  page("u-flicker-timelapse", {
    title: "Evening out exposure jumps in a time-lapse",
    summary: "Time-lapse frames jump in brightness because of auto exposure and changing light; smooth the exposure curve without losing the day's change.",
    tags: [T.flicker, T.sky],
    parameterNames: ["smoothingWindow"],
    body:
      "A time-lapse over a city or sky jumps brighter and darker every few frames, because the camera adjusted exposure or the aperture stepped between shots. Graph each frame's average brightness, fit a smooth curve through it, and grade each frame onto the curve so the gradual day-to-night change stays. Clouds passing in front of the sun are real and should survive, so smooth over a short window, not the whole sequence. Aperture flicker can change depth of field and vignetting too, which a grade alone cannot fix.",
  }),
  page("u-flicker-local-region", {
    title: "Deflickering one region, not the whole frame",
    summary: "When only a lamp, window or patch of wall flickers, mask it and steady its brightness while the rest of the picture stays untouched.",
    tags: [T.flicker, T.night],
    body:
      "Sometimes one practical flickers, a street lamp outside or a lit window in the background, while the rest of the shot is steady. A global deflicker would pump the whole frame to chase one small light. Roto the area the light affects, including the pool it throws on walls and ground, and deflicker inside the mask only, with a soft edge. Track the mask if the camera moves. The hardest cases are where the flickering light falls on an actor's face, which needs a separate pass.",
  }),

  // ── Lens problems ────────────────────────────────────────────────────────────
  page("u-undistort-redistort", {
    title: "Undistorting for paint and redistorting on the way out",
    summary: "Remove lens distortion before straight-line paint and tracking, then put it back exactly so the plate matches the original.",
    tags: [T.distortion],
    parameterNames: ["distortionModel", "overscan"],
    body:
      "Wide lenses bow straight lines, so a clone along a doorframe or a planar track on a wall slides as things move towards the edge of frame. Solve the distortion from the lens grid shot for that lens, undistort the plate with overscan so no edge pixels are lost, do the paint and tracking on the straight version, and redistort at the end. Take only the painted areas from the redistorted result and keep everything else original, since two resamples soften the image. Use the same distortion solve for every shot on that lens.",
  }),
  page("u-vignette-balance", {
    title: "Flattening vignetting in the corners",
    summary: "Corners that fall off darker than the centre are lifted with a measured gain before tiling, stitching or screen work.",
    tags: [T.vignetting],
    parameterNames: ["falloffRadius", "cornerGain"],
    body:
      "Lenses shot wide open darken toward the corners, which looks fine on a single plate but shows as bands when plates are tiled or a panorama is stitched. Shoot or find a flat grey frame from the same lens and stop, divide the plate by it to flatten the falloff, and multiply it back afterwards if the look is wanted. Without a grey frame, build a radial gain by eye on a flat area such as sky. Lifting corners also lifts noise there, so check the grain.",
  }),
  page("u-chromatic-fringe", {
    title: "Taming colour fringes on high-contrast edges",
    summary: "Purple, green or red edges around bright backlit detail come from the lens and are reduced by realigning channels or desaturating the fringe.",
    aliases: ["colour fringing", "purple fringing"],
    tags: [T.aberration, T.sky],
    parameterNames: ["channelScale", "fringeHue"],
    body:
      "Branches against bright sky, window frames and backlit hair show a thin purple or green line along the edge, stronger toward the corners of frame. Where the fringe grows with distance from the centre, scale the red and blue channels slightly against green to realign them. The rest, usually purple halos around highlights, is removed by selecting the fringe hue along edges and desaturating it. Do this before keying, as fringes turn into hard coloured lines in a matte.",
  }),
  page("u-flare-removal", {
    title: "Removing a lens flare that crosses the action",
    summary: "Paint out flare streaks and ghosts from a bright light and rebuild the picture they washed out.",
    tags: [T.flare],
    parameterNames: ["flareMask"],
    body:
      "A bright light in or just outside frame throws streaks, coloured rings and a haze across the picture, and the client wants it gone or moved. The flare is added light, so in flat areas it can be subtracted with a matched shape and grade. Where it crosses detail or an actor, the washed-out contrast has to be rebuilt from frames where the flare is elsewhere. Flare elements line up through the frame centre opposite the light source, which helps predict where ghosts will fall. If a replacement flare is wanted, remove the original fully first.",
  }),

  // ── Screens ──────────────────────────────────────────────────────────────────
  page("u-screen-creases", {
    title: "Smoothing creases and folds in a green screen",
    summary: "Wrinkled cloth screens throw shading lines that key as holes; smooth the screen before keying.",
    tags: [T.uneven, T.green],
    body:
      "A cloth screen that was not stretched tight shows creases and folds as darker lines and lighter ridges, and the key tears along them. Before keying, pull a rough matte of the foreground and paint or blur the screen area outside it so the folds disappear, then key the smoothed plate. Folds near the actor's edge are the hard part, as they have to be cleaned right up to hair and skin. If the folds move in the wind, track the cleanup or work a few frames at a time.",
  }),
  page("u-screen-seams-tape", {
    title: "Painting out seams and tape on a blue screen",
    summary: "Panel joins, gaffer tape and clips on a blue screen key as lines and blobs and are painted to screen colour before keying.",
    tags: [T.uneven, T.blue],
    body:
      "A blue screen built from panels or several pieces of cloth shows seams where they meet, and the tape holding them sits as a patch of a different colour. The key reads these as foreground. Paint the seams and tape to the surrounding screen colour, tracked to the camera move, or cover them with a garbage matte if they are well clear of the action. Tracking markers often sit on the same tape and come out in the same pass.",
  }),
  page("u-screen-uneven-light", {
    title: "Flattening a screen lit hot in the middle",
    summary: "A screen lit bright in the centre and dark at the edges is evened out with a clean-plate difference before keying.",
    aliases: ["screen flattening", "clean plate difference"],
    tags: [T.uneven, T.green],
    parameterNames: ["cleanPlateFrame", "screenColour"],
    houseMethodFor: ["uneven-screen"],
    body:
      "A green screen with a hot spot in the middle and falloff to the edges and floor cannot be keyed with one setting; tighten the key for the centre and the dark edges come through. Take a clean plate of the screen, or build one by painting the actor out, and divide or subtract it so the screen becomes one flat colour everywhere. Key the flattened plate and apply the matte to the original. Where the camera moves and no clean pass exists, generate the clean plate from a smooth fit across the visible screen.",
  }),
  page("u-spill-on-hair-skin", {
    title: "Despilling green bounce on skin and hair",
    summary: "Green light bouncing off the screen tints edges, hair and skin; suppress the green without turning skin grey.",
    aliases: ["despill", "green bounce"],
    tags: [T.spill, T.hair, T.skin],
    parameterNames: ["spillLimit", "skinProtect"],
    body:
      "An actor standing close to a green screen picks up a green cast on the shoulders, the side of the face and through fine hair. Limit green to the average of red and blue, or to whichever is higher, and apply it only where the spill is. Skin goes grey or magenta when despill is too strong, so protect skin tones with a key and restore a warm balance. Hair spill is best handled on the edge matte, replacing the green with the new background's colour.",
  }),

  // ── Logos, signage and devices ───────────────────────────────────────────────
  page("u-logo-on-clothing", {
    title: "Removing a logo from a moving T-shirt",
    summary: "A brand mark on clothing folds and stretches, so the patch has to be warped with the cloth every frame.",
    aliases: ["clothing logo removal"],
    tags: [T.logos, T.skin],
    body:
      "An actor wears a shirt or cap with a clearly readable brand, and legal wants it gone. The cloth folds, stretches and turns, so a corner pin slides off within a few frames. Paint a clean frame of the fabric, then attach it with a mesh warp or many small tracks that follow the folds. Keep the fold shading from the original over the patch, or the logo area looks flat. Large turns of the body need a second clean frame.",
  }),
  page("u-shopfront-signage", {
    title: "Replacing shop signage on a street",
    summary: "Planar-track storefront signs and billboards and cover them with neutral boards or invented names.",
    tags: [T.logos, T.set],
    shotCodes: ["KY_220_0015"],
    body:
      "Street shots are full of real shop names, billboards and posters that cannot stay. A sign on a flat wall follows the camera as a plane, so a planar track and a patch with an invented name or a plain board sits well. Match the weathering, lighting and focus of the original, and add the sign's reflection in windows if it appears. Signs at grazing angles or very far from camera may be simpler to soften out than to replace.",
  }),
  page("u-phone-screen-replace", {
    title: "Blanking or replacing a phone or laptop screen in shot",
    summary: "Readable apps, glare or a glowing blank screen on a device are replaced with a tracked insert or a clean dark screen.",
    aliases: ["screen replacement", "screen insert"],
    tags: [T.logos, T.markers],
    parameterNames: ["cornerPin", "screenGlare"],
    body:
      "A phone, tablet or laptop in shot shows a real app, a notification or just a glowing screen, and the edit needs it dark or showing designed graphics. Track the four corners of the screen, often helped by markers stuck on the glass, and corner-pin the insert. Keep the reflections and fingerprint smudges from the original over the top so the screen still reads as glass. Fingers crossing the screen need roto so they stay in front.",
  }),

  // ── Skin ─────────────────────────────────────────────────────────────────────
  page("u-blemish-cleanup", {
    title: "Spot and blemish cleanup on close-ups",
    summary: "Spots, scars and shaving rash are painted out on a close-up with tracked patches that keep the skin's pores.",
    aliases: ["skin cleanup", "beauty pass"],
    tags: [T.beauty, T.skin],
    parameterNames: ["poreDetail", "trackPoints"],
    houseMethodFor: ["beauty"],
    body:
      "On a close-up an actor has a spot, a cold sore, a shaving cut or a bruise that make-up did not cover. Paint it out on one frame using skin from nearby, keeping pore detail and the direction of the light, and track the patch to the face. Avoid a blurry plastic look: split the skin into fine and broad detail, clean the broad layer and keep the fine layer. Expressions fold the skin, so check the patch through every movement.",
  }),
  page("u-tattoo-cover", {
    title: "Covering a tattoo on moving skin",
    summary: "Hide a tattoo on an arm or neck that bends and turns, with a patch warped to the skin.",
    tags: [T.beauty, T.skin],
    body:
      "An actor's tattoo on the forearm, hand or neck was not covered on the day and the character should not have one. The patch is large and has to follow muscles, veins and stretching skin, so use a mesh warp or a 2.5D track on the limb. Build the clean skin from the actor's own skin elsewhere, matching colour under the different light. Body hair over the tattoo is difficult; remove it in the patch and add a little back from the plate.",
  }),

  // ── Sky and water ────────────────────────────────────────────────────────────
  page("u-contrail-plane", {
    title: "Painting an aircraft and its contrail out of the sky",
    summary: "Planes, helicopters and vapour trails are removed from sky plates for period or remote settings.",
    aliases: ["contrail removal"],
    tags: [T.debris, T.sky],
    body:
      "A period or remote shot has a passenger jet crossing the sky, or a long white vapour trail drawn across the clouds. Small aircraft can be painted out frame by frame from nearby sky. The trail is larger and softer: rebuild the sky behind it from frames before the trail was drawn, or with clouds patched from the same plate, matching the gradient. The trail's shadow on lower cloud can also show.",
  }),
  page("u-water-debris", {
    title: "Removing floating rubbish from moving water",
    summary: "Bottles and rubbish on a river or sea are painted out with patches taken from the water's own moving surface.",
    aliases: ["floating debris removal"],
    tags: [T.debris, T.water],
    body:
      "A river or harbour shot has a plastic bottle, foam or a piece of wood drifting through frame. Water never holds still, so a single clean frame cannot be held over it: take a patch of moving water from nearby or from an earlier frame and move it with the current. Match the ripple size and speed, since water further away shows smaller waves. Watch for the object's reflection and the wake it leaves.",
  }),

  // ── Camera motion ────────────────────────────────────────────────────────────
  page("u-rolling-shutter-skew", {
    title: "Straightening skewed verticals from rolling shutter",
    summary: "On fast pans the image leans and wobbles because the sensor reads line by line; correct it before tracking or paint.",
    aliases: ["shutter skew", "jello"],
    tags: [T.rollingShutter, T.motion],
    parameterNames: ["readoutTime"],
    body:
      "On a whip pan or with a camera shaken on a car mount, vertical lines such as lampposts and door frames lean over, and the picture wobbles like jelly. The sensor reads its lines top to bottom, so each line was captured at a slightly different moment. Estimate the readout time and correct each line against the camera's motion. Tracks and planar patches do not hold on the uncorrected plate. Fast moving objects such as propellers also bend and cannot be fixed with the same correction.",
  }),
  page("u-stabilise-handheld", {
    title: "Stabilising handheld jitter without losing the move",
    summary: "Smooth the unwanted shake out of a handheld or long-lens shot while keeping the intended pan.",
    tags: [T.motion],
    body:
      "A handheld or long-lens shot jitters more than the director wants, but the operator's move is right. Track the plate, smooth the curve over a window of frames and apply only the difference, so the pan stays. Stabilising moves the picture, so edges come into frame; scale up slightly or paint the edges back. Motion blur baked into the frames stays when the shake is removed, which shows on strong jolts.",
  }),

  // ── Compression and banding ──────────────────────────────────────────────────
  page("u-sky-banding", {
    title: "Breaking up banding in smooth gradients",
    summary: "Visible steps in a sky or plain wall from low bit depth or heavy compression are hidden with a smooth rebuild and fine noise.",
    aliases: ["banding", "posterisation"],
    tags: [T.compression, T.sky],
    parameterNames: ["ditherAmount"],
    body:
      "A clear evening sky, fog or a plain wall shows rings or stripes of flat colour instead of a smooth blend. The plate was stored with too few levels or compressed hard. Blur the banded area to rebuild a smooth gradient, then add fine noise or grain so the output file does not band again. Apply it only in the gradient, through a mask, to protect detail. Some banding only appears in the final delivery format, so test the output.",
  }),
  page("u-macroblocking", {
    title: "Repairing blocky compression in dark areas",
    summary: "Square block artefacts in the shadows and night plates of heavily compressed footage are smoothed and regrained.",
    aliases: ["macroblocking", "compression blocks"],
    tags: [T.compression, T.night],
    parameterNames: ["blockSize", "deblockStrength"],
    body:
      "Footage from a small camera or a drone arrives with its shadows broken into squares that shift every few frames. The blocks follow the camera's compression grid, so a deblock filter that smooths along the grid edges removes most of it. Heavy cases need the dark areas rebuilt by temporal averaging. Regrain afterwards so the smoothed shadows do not look flat. Detail lost in compression cannot be recovered, so keep expectations for very dark shots low.",
  }),
];
