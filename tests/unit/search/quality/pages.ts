/**
 * The search quality corpus (issue 16): invented Kestrel Yard write-ups in look-alike groups —
 * several marker methods, several wire and rig methods, dust and scratches, dead pixels, shadows,
 * reflections, crew, screens, grain, logos, debris, lens and camera problems, skin. Trade content
 * is common practice, no published source. Written before the engine was tuned; the benchmark
 * (bench/search.ts) embeds the same pages in large synthetic corpora, so keep this file free of vitest.
 */
import type { SearchDocument, SearchTag } from "@/lib/search/types";

export const tag = (slug: string, name: string, kind: SearchTag["kind"], aliases: string[] = []): SearchTag => ({ slug, name, kind, aliases });

export const TAGS = {
  markers: tag("tracking-markers", "Tracking markers", "problem", ["tracker dots", "tape crosses", "markers"]),
  wire: tag("wire-or-rig", "Wire or rig", "problem", ["wire removal", "rig removal", "stand"]),
  dust: tag("dust-and-scratches", "Dust and scratches", "problem", ["dust busting", "film dirt", "scratch"]),
  deadPixels: tag("dead-or-stuck-pixels", "Dead or stuck pixels", "problem", ["hot pixels", "stuck pixels"]),
  boom: tag("boom-or-shadow", "Boom or shadow", "problem", ["boom mic", "crew shadow"]),
  reflections: tag("reflections", "Reflections", "problem", ["crew reflection", "camera reflection"]),
  crew: tag("crew-in-shot", "Crew in shot", "problem", ["crew removal", "people in background"]),
  uneven: tag("uneven-screen", "Uneven screen", "problem", ["patchy screen", "screen flattening"]),
  grain: tag("grain-and-noise", "Grain and noise", "problem", ["regrain", "denoise"]),
  logos: tag("logos-and-signage", "Logos and signage", "problem", ["brand removal", "signage"]),
  spill: tag("colour-spill", "Colour spill", "problem", ["despill", "green spill"]),
  debris: tag("debris", "Debris and birds", "problem", ["birds", "floating debris"]),
  distortion: tag("lens-distortion", "Lens distortion", "problem", ["barrel distortion", "undistort"]),
  vignetting: tag("vignetting", "Vignetting", "problem", ["vignette"]),
  rollingShutter: tag("rolling-shutter", "Rolling shutter", "problem", ["shutter skew"]),
  flicker: tag("flicker", "Flicker", "problem", ["deflicker"]),
  aberration: tag("chromatic-aberration", "Chromatic aberration", "problem", ["colour fringing"]),
  moire: tag("moire", "Moiré", "problem", ["moire pattern"]),
  sensorDust: tag("sensor-dust", "Sensor dust", "problem", ["sensor spots"]),
  flare: tag("lens-flare", "Lens flare", "problem", ["flare"]),
  beauty: tag("beauty", "Beauty work", "problem", ["skin cleanup"]),
  compression: tag("compression", "Compression and banding", "problem", ["macroblocking", "banding"]),
  motion: tag("camera-motion", "Camera motion", "problem", ["stabilise", "shake"]),
  green: tag("green-screen", "Green screen", "plate", ["greenscreen"]),
  blue: tag("blue-screen", "Blue screen", "plate", ["bluescreen"]),
  sky: tag("sky", "Sky", "plate", ["clouds"]),
  skin: tag("skin", "Skin", "plate", ["face"]),
  water: tag("water", "Water", "plate", ["sea", "river"]),
  night: tag("night-exterior", "Night exterior", "plate", ["night ext"]),
  set: tag("set-surfaces", "Set surfaces", "plate", ["walls", "floor"]),
  hair: tag("hair", "Hair", "plate"),
  film: tag("film-scan", "Film scan", "plate", ["scanned film"]),
  car: tag("car", "Cars", "plate", ["vehicle"]),
};

export type PageInput = {
  title: string;
  summary: string;
  tags: SearchTag[];
  body: string;
  aliases?: string[];
  parameterNames?: string[];
  shotCodes?: string[];
  houseMethodFor?: string[];
};

/** A page maker whose technique ids are `<idPrefix>-001`, `-002`, … in the order pages are made. */
export function pageMaker(idPrefix: string): (slug: string, p: PageInput) => SearchDocument {
  let counter = 0;
  return (slug, p) => {
    counter++;
    return {
      techniqueId: `${idPrefix}-${String(counter).padStart(3, "0")}`,
      slug,
      title: p.title,
      summary: p.summary,
      aliases: p.aliases ?? [],
      tags: p.tags,
      parameterNames: p.parameterNames ?? [],
      shotCodes: p.shotCodes ?? [],
      bodyText: p.body,
      status: "approved",
      houseMethodFor: p.houseMethodFor ?? [],
      updatedAt: `2026-0${1 + (counter % 9)}-1${counter % 10}T10:00:00.000Z`,
    };
  };
}

const page = pageMaker("qp");

const T = TAGS;

export const QUALITY_PAGES: SearchDocument[] = [
  // ---- tracking markers --------------------------------------------------------------------
  page("markers-green-matrix", {
    title: "Marker removal on green screen with a channel matrix",
    summary: "The department's way to clear tracking markers from a green backing before the key.",
    aliases: ["green screen marker cleanup"],
    tags: [T.markers, T.green],
    parameterNames: ["markerRow", "screenLevel", "matteSoftness"],
    shotCodes: ["SLM_040_0120"],
    houseMethodFor: ["tracking-markers"],
    body: "Green screen markers are usually pink, orange or a darker green tape. Sample the markers and the screen, solve a matrix row so both land on the same value in the green channel, copy that channel into the others with a level match and mix the result back through a marker matte. Restore grain at the end. Works on locked and moving cameras alike because nothing is tracked. Fails when hair or motion blur crosses a marker: paint those frames by hand.",
  }),
  page("markers-blue-matrix", {
    title: "Marker removal on blue screen with a channel matrix",
    summary: "Hide tracking markers on a blue backing by rebuilding the channel where they differ from the screen.",
    tags: [T.markers, T.blue],
    parameterNames: ["markerRow", "screenLevel"],
    body: "On blue screens the markers are often a lighter blue or white tape. The blue channel hides them worst, so solve the matrix row on red or green and rebuild from there. Keep the original plate outside the screen area with a mix through matte. Check the edges of any foreground that crosses the marker row.",
  }),
  page("markers-moving-camera-planar", {
    title: "Markers on a moving camera: planar-tracked patches",
    summary: "When the camera travels a lot, track each surface with a planar track and carry one clean patch through the move.",
    tags: [T.markers, T.motion],
    parameterNames: ["patchSize", "trackWindow"],
    body: "Handheld and crane moves change the perspective of every marker. Give each screen panel or wall its own planar track, paint a clean patch on the frame where the marker is most square to camera and reapply it through the track. Regrain the patch. Fails when the surface is not flat or when the marker leaves frame and comes back.",
  }),
  page("markers-locked-off-held-frame", {
    title: "Markers on a locked-off shot: one clean frame held through",
    summary: "With a static camera, paint one frame clean and hold it under a matte for the whole shot.",
    tags: [T.markers],
    body: "If the camera does not move, a single painted frame can cover every marker. Roto the people who pass in front of the markers and keep them on top. The held frame freezes the grain, so add moving grain back or the patch reads as a still. Check for slow light changes across long takes.",
  }),
  page("markers-walls-floors", {
    title: "Painting markers off walls and floors",
    summary: "Patch markers stuck on real set surfaces with a tracked clean patch instead of a channel trick.",
    tags: [T.markers, T.set],
    body: "On brick, wood or concrete there is no flat screen colour to match. Clone from texture next to the marker on one frame, track it, and blend the edges. Floors under moving people need the feet and shadows rotoscoped on top.",
  }),
  page("markers-face-dots", {
    title: "Removing facial tracking dots",
    summary: "Clean small dots put on an actor's face for facial capture without smearing the pores.",
    tags: [T.markers, T.skin],
    body: "Dots on skin move with every expression, so a still patch slides. Use a short-offset clone from neighbouring skin on each frame, or warp a clean frame to follow the face. Keep the pore texture and check at full resolution; colour-match under changing light.",
  }),
  page("markers-hair-motion-blur", {
    title: "Markers behind hair and motion-blurred edges",
    summary: "Finish marker cleanup where fine hair or fast movement crosses the marker.",
    tags: [T.markers, T.hair],
    body: "Channel tricks break where a strand of hair or a blurred arm passes over a marker: the edge goes dark or a ghost of the marker stays. Pull the marker out underneath with a clean screen patch and rebuild the edge from the key, not from paint. Animate the matte frame by frame across the blur.",
  }),
  page("markers-under-moving-light", {
    title: "Markers under changing light on the screen",
    summary: "Marker cleanup when the screen brightness moves during the shot, from practical lights or passing shadows.",
    tags: [T.markers, T.uneven],
    body: "A solved matrix assumes the screen and marker keep their relation. When a light flickers or a shadow crosses the backing, solve on several frames and blend the results over time, or flatten the screen first and solve on the flattened plate.",
  }),
  page("markers-screen-coloured-keyer", {
    title: "Letting the keyer take screen-coloured markers",
    summary: "Markers taped in a slightly different green can simply be keyed out with the screen.",
    tags: [T.markers, T.green],
    body: "Some shoots use markers in a shade close to the backing. Push the key so the markers fall into the screen and check that no edge detail is lost. Cheaper than paint when it works; fails when the markers sit behind semi-transparent detail such as smoke or hair.",
  }),
  page("markers-location-ground", {
    title: "Survey marks and cones on location ground",
    summary: "Remove cones, paint spots and tape crosses put on grass, sand or tarmac for the camera track.",
    tags: [T.markers, T.set],
    body: "Exterior tracking marks sit on uneven ground with real texture and shadows. Use a patch projected on the ground plane from the camera solve, and keep the ground's own grain. Small paint spots on tarmac can be cloned on one frame and tracked.",
  }),

  // ---- wires -------------------------------------------------------------------------------
  page("wire-over-sky", {
    title: "Wire removal over clear sky",
    summary: "Take out thin stunt wires over sky or other smooth areas by filling from either side.",
    tags: [T.wire, T.sky],
    parameterNames: ["fillBlur"],
    houseMethodFor: ["wire-or-rig"],
    body: "Over a smooth sky a wire can be filled from its neighbours: roto a thin shape along the wire, blur the sky next to it into the shape and add grain back. Fast and clean. Fails over clouds with detail or anywhere the background has texture.",
  }),
  page("wire-busy-background-offset", {
    title: "Wire removal over busy backgrounds with frame offsets",
    summary: "Borrow the background from frames where the wire has moved away, aligned with a track.",
    tags: [T.wire],
    parameterNames: ["frameOffset", "alignTrack"],
    body: "Against trees, buildings or crowds a blur fill shows. Look for a frame where the wire sits elsewhere, align that frame with a track and use it under a thin matte. For a locked camera the offset can be large; for moving cameras keep it short.",
  }),
  page("wire-across-actor", {
    title: "Wires crossing the actor's body or costume",
    summary: "Paint wires out where they pass in front of the performer, keeping the costume's folds.",
    tags: [T.wire, T.skin],
    body: "Where the wire crosses the performer there is no clean background to borrow. Clone along the costume's folds, track the patch to the body and check the result in motion. Faces need the most care; a short-offset clone from the same frame often works best.",
  }),
  page("wire-harness-bulges", {
    title: "Harness bulges under costume",
    summary: "Reshape clothing where a flying harness shows through as lumps and straps.",
    tags: [T.wire, T.skin],
    body: "A body harness under a costume shows as hard lines at the hips and a bump at the back. Warp the costume outline locally, paint out strap edges and keep the fabric texture. Track each patch to the body part it sits on.",
  }),
  page("wire-motion-blurred", {
    title: "Motion-blurred wires in fast stunts",
    summary: "Wires smeared by fast movement become wide soft streaks that need a wider matte.",
    tags: [T.wire],
    body: "During a fast fall the wire is blurred into a soft band several pixels wide. Grow the matte to the whole blur, fill from offset frames and feather generously. Check that the actor's own motion blur is not clipped.",
  }),
  page("wire-against-moving-clouds", {
    title: "Wires against moving clouds or smoke",
    summary: "When the background itself moves, frame offsets fail and the fill must be rebuilt.",
    tags: [T.wire, T.sky],
    body: "Drifting cloud or smoke behind a wire changes every frame, so borrowed frames do not line up. Rebuild the background by cloning texture along the wire with a soft brush frame by frame, or build a clean cloud layer and warp it to follow the drift.",
  }),
  page("wire-through-hair", {
    title: "Fine wires through hair",
    summary: "Removing a thin wire that passes through loose hair without losing strands.",
    tags: [T.wire, T.hair],
    body: "Hair and wire are the same width, so a matte that takes the wire also eats strands. Key the wire by its colour where possible, paint the strands back with a fine clone, and check every frame at full resolution.",
  }),

  // ---- rigs --------------------------------------------------------------------------------
  page("rig-clean-plate", {
    title: "Rig removal with a clean plate",
    summary: "Replace large rigs, stands and cranes using a clean pass shot without them.",
    tags: [T.wire],
    body: "Big rigs cannot be filled from nearby pixels. Line up the clean pass with the main plate using a track, match the lighting with a colour matrix and mix it in through a roto matte around the rig.",
  }),
  page("rig-rebuild-background", {
    title: "Rebuilding the background when no clean plate was shot",
    summary: "Build a clean background from several frames of the take when the rig never leaves frame entirely.",
    tags: [T.wire],
    body: "Collect the parts of the background that each frame shows, stabilise them, and combine them into one clean frame with a temporal median. Then track it back into the move. Fill what no frame shows by hand.",
  }),
  page("rig-light-stands-frame-edge", {
    title: "Light stands at the frame edge",
    summary: "Remove the legs of lighting stands and their sandbags that creep into the side of frame.",
    tags: [T.wire, T.set],
    body: "A stand leg or a sandbag in the corner of a wide is usually small. Clone from the floor next to it, track the patch and check that the shadow of the stand goes too. If the camera pans, a clean frame from the other end of the pan helps.",
  }),
  page("rig-crash-mats", {
    title: "Crash mats and pads on the ground",
    summary: "Paint out the landing mats and pads that stunt teams put down.",
    tags: [T.wire, T.set],
    body: "Mats are large and often sit under the performer at the end of a fall. Use a clean plate if one exists; otherwise project a ground patch from the camera solve. The performer's contact shadow must be rebuilt on the new ground.",
  }),
  page("rig-puppet-rods", {
    title: "Puppet rods and prop rigs",
    summary: "Remove the rods that puppeteers use to move props and creatures.",
    tags: [T.wire],
    body: "Rods are thin and move with the prop. Roto the rod, fill from offset frames and watch where the rod meets the prop: the join usually needs a small patch tracked to the prop.",
  }),
  page("rig-tow-bar-car", {
    title: "Tow bars and low loaders on car shots",
    summary: "Clean the towing rig from car shots filmed on a trailer.",
    tags: [T.wire, T.car],
    body: "Car scenes towed on a low loader show the bar, the trailer edge and sometimes the tow truck. Replace the road under the car from a clean plate or a moving road patch, and paint the bar out of the car's reflections too.",
  }),
  page("rig-dolly-track", {
    title: "Camera dolly track in shot",
    summary: "Paint out dolly track and its wedges when the camera sees its own rails.",
    tags: [T.wire, T.set],
    body: "When a reverse angle catches the dolly rails, rebuild the floor from a clean pass or clone along the track's direction. Long straight rails need a patch tracked to the floor plane.",
  }),

  // ---- dust, dirt, scratches ---------------------------------------------------------------
  page("dust-busting-film-scans", {
    title: "Dust busting scanned film",
    summary: "Take out dirt that sits on one frame only, by comparing each frame with its neighbours.",
    tags: [T.dust, T.film],
    houseMethodFor: ["dust-and-scratches"],
    body: "Film dirt appears on one frame and is gone on the next, white on the negative, dark on prints. Detect it by the difference with the frames before and after and fill from them. This does not cover sensor dust, which stays in the same place on every frame: see the sensor dust write-up.",
  }),
  page("film-scratch-vertical", {
    title: "Vertical scratches on film scans",
    summary: "Repair long scratches that run down the frame in the same place for many frames.",
    tags: [T.dust, T.film],
    body: "A scratch from the gate or the projector runs vertically and stays put for a run of frames, so frame comparison cannot see it. Fill it from pixels left and right with a thin matte and regrain. Check moving detail that crosses it.",
  }),
  page("sensor-dust-fixed-spots", {
    title: "Sensor dust: soft spots fixed on every frame",
    summary: "Remove soft dark blobs that sit in the same place on each frame from one digital camera.",
    tags: [T.sensorDust],
    body: "Dust on a digital sensor shows as a soft, slightly dark circle, most visible on sky and flat walls at small apertures. It does not move with the picture. Build a correction from a flat area: divide by the spot's shape, or clone it out once per shot if the camera is locked. Check every camera's plates: the same spot repeats across shots.",
  }),
  page("lens-dirt-water-drops", {
    title: "Dirt and water drops on the lens",
    summary: "Clean blurry smudges and rain drops that sit on the front of the lens.",
    tags: [T.sensorDust, T.water],
    body: "Drops and smudges on the lens are very soft and refract what is behind them. They move only when the camera does. Track the area, patch from frames where the background moved on, and rebuild any refraction by hand.",
  }),
  page("gate-hair-edge", {
    title: "Hair in the gate",
    summary: "A hair caught in the film gate wiggles at the frame edge through a whole take.",
    tags: [T.dust, T.film],
    body: "A gate hair is dark, thin and curly, and dances at the edge of frame. Roto it loosely and fill from offset frames, or crop if the delivery allows. It often appears on every shot of the same roll.",
  }),
  page("light-leak-flash-frames", {
    title: "Light leaks and flash frames at roll ends",
    summary: "Even out frames that go bright or orange at the start and end of a film roll.",
    tags: [T.film, T.flicker],
    body: "Fogged frames near a roll change flare orange or white in one corner. Grade the affected frames back to their neighbours with a soft matte over the leak, or replace the worst frame with a blend of the frames around it.",
  }),
  page("floating-dust-in-light", {
    title: "Dust drifting in a light beam",
    summary: "Calm or remove floating particles lit by a strong light on set.",
    tags: [T.dust],
    body: "Dust in the air is part of the scene, not a defect of the image: it moves in depth and parallax. Remove the brightest particles with a temporal fill and leave the faint ones, or the shot looks too clean next to its neighbours.",
  }),

  // ---- dead pixels -------------------------------------------------------------------------
  page("dead-pixel-repair", {
    title: "Dead and stuck pixel repair",
    summary: "Fix single pixels that stay black, stay bright or stick in one channel in every frame.",
    tags: [T.deadPixels],
    houseMethodFor: ["dead-or-stuck-pixels"],
    body: "A bad photosite shows at the same position on every frame from one camera. Find it on a dark frame, make a map of its position and fill each pixel from its neighbours with a median. Keep the map per camera body.",
  }),
  page("hot-pixels-dark-plates", {
    title: "Hot pixels in dark plates",
    summary: "Bright coloured pixels that appear in night and long-exposure plates as the sensor warms.",
    tags: [T.deadPixels, T.night],
    body: "Hot pixels come and go with sensor temperature, so a fixed map misses some. Detect them per frame as single bright outliers against a median of their neighbours and fill only those. Red, green or blue single-pixel sparkles in the blacks are the sign.",
  }),
  page("dead-sensor-column", {
    title: "Dead sensor columns and lines",
    summary: "Repair a whole column or row of the sensor that reads wrong, visible as a thin straight line.",
    tags: [T.deadPixels],
    body: "A failing readout makes a one-pixel line from top to bottom at the same position on every frame. Interpolate the column from its neighbours left and right. Unlike a film scratch it is perfectly straight and exactly one pixel wide.",
  }),
  page("led-wall-dead-leds", {
    title: "Dead LEDs in a video wall behind the actors",
    summary: "Fill dark squares where single LED modules failed on a display wall in shot.",
    tags: [T.deadPixels, T.set],
    body: "A failed module shows as a black or coloured square in the wall's grid. Track the wall, clone a neighbouring module's content or the wall's own image into the gap and match its brightness. Defocus the patch to match the wall's softness.",
  }),

  // ---- boom and shadows --------------------------------------------------------------------
  page("boom-mic-in-frame", {
    title: "Boom mic dipping into frame",
    summary: "Remove the sound boom when it drops into the top of frame.",
    tags: [T.boom],
    houseMethodFor: ["boom-or-shadow"],
    body: "The boom usually enters from the top for a few frames. Fill from frames where it is out of shot, or from a clean plate, and track the patch. Check for its reflection in windows and its shadow on walls.",
  }),
  page("boom-shadow-wall", {
    title: "Boom shadow on a wall",
    summary: "Lift the soft moving shadow that the boom casts on set walls.",
    tags: [T.boom, T.set],
    body: "A boom shadow is soft and moves with the operator. Roto it with a generous feather and lift its brightness back to the lit wall with a grade, keeping the wall's texture. Painting over it loses the texture.",
  }),
  page("crew-shadow-ground", {
    title: "Crew and camera shadows on the ground",
    summary: "Remove the shadows of crew, camera and equipment falling across the floor or street.",
    tags: [T.boom, T.crew],
    body: "Low sun throws the shadow of the camera team into the shot. Roto the shadow, grade it up to match the lit ground and repaint the texture where the grade shows. Long shadows that move with the camera need tracking.",
  }),
  page("flag-shadow-on-face", {
    title: "Lifting a hard shadow off a face",
    summary: "Soften or remove the shadow of a flag, stand or hat brim that cuts across a face.",
    tags: [T.boom, T.skin],
    body: "A hard edge across a face needs a graded lift that follows the face's shape. Track the shadow edge, grade the dark side up and match the skin colour, which shifts in shadow. Keep the eyes and their highlights.",
  }),
  page("crane-shadow-moving-shot", {
    title: "Crane shadow on a moving shot",
    summary: "Remove the shadow of a camera crane that sweeps across the ground during a move.",
    tags: [T.boom],
    body: "The shadow of a crane arm moves with the camera and grows at the end of the move. Project a clean ground patch from the solve and grade inside the shadow shape. Leave the actors' own shadows untouched.",
  }),

  // ---- reflections -------------------------------------------------------------------------
  page("reflection-car-bodywork", {
    title: "Crew reflections in car bodywork",
    summary: "Remove the camera team reflected in doors, bonnets and chrome of picture cars.",
    tags: [T.reflections, T.car],
    body: "Polished paint shows the crew as dark smeared figures that slide over the curves. Rebuild the reflected environment from the clean side of the car or a reflection plate, warp it to the panel and keep the highlights.",
  }),
  page("reflection-window-glass", {
    title: "Reflections in windows and shop glass",
    summary: "Take out crew and camera reflected in windows, glass doors and shop fronts.",
    tags: [T.reflections],
    body: "Glass shows both what is behind it and what is in front. Separate the two with a clean pass or by keying the reflection's brightness, remove the crew from the reflected layer and add it back. A person visible inside the window is not a reflection: treat it as crew in shot.",
  }),
  page("reflection-in-eyes", {
    title: "Camera and lights reflected in eyes",
    summary: "Clean the camera, crew or a bright panel reflected in an actor's eyes.",
    tags: [T.reflections, T.skin],
    body: "Close-ups show the set in the eyes. Keep one catchlight, paint out the shape of the camera or the operator and track the patch to the eye. Check blinks and eye movements frame by frame.",
  }),
  page("reflection-sunglasses-visor", {
    title: "Reflections in sunglasses and helmet visors",
    summary: "Replace crew reflected in dark glasses, visors and goggles.",
    tags: [T.reflections],
    body: "Curved dark lenses show a small distorted world. Build a clean environment, warp it to the lens shape and track it to the head. Keep the sheen of the glass on top.",
  }),
  page("reflection-water-surface", {
    title: "Crew reflected in water and puddles",
    summary: "Remove people and equipment reflected in puddles, ponds and wet streets.",
    tags: [T.reflections, T.water],
    body: "Reflections in water ripple and break up. Paint the reflected layer clean on a calm frame and distort it with the ripples, or replace the reflection with one taken from a clean plate.",
  }),
  page("reflection-mirror-shot", {
    title: "Camera in a mirror shot",
    summary: "Remove the camera and operator from a shot that films into a mirror.",
    tags: [T.reflections, T.set],
    body: "Mirror shots often see the camera itself. Shoot a clean pass with the camera moved, or rebuild the room behind the camera from other angles, and track it into the mirror plane.",
  }),

  // ---- crew in shot ------------------------------------------------------------------------
  page("crew-people-background", {
    title: "Removing people from the background",
    summary: "Take out crew members, onlookers and passers-by who are in the back of the frame.",
    tags: [T.crew],
    houseMethodFor: ["crew-in-shot"],
    body: "A person in the distance is small but the eye finds them. Fill from frames where they have moved on, or from a clean plate, and track the patch. Keep shadows and reflections they cast in mind.",
  }),
  page("crew-member-frame-edge", {
    title: "A crew member half in frame",
    summary: "Clean an elbow, a shoulder or a hand of the crew that sneaks into the edge of frame.",
    tags: [T.crew],
    body: "Edges are easier than the middle: extend the background from the inside with a clone, or reposition the frame slightly if the delivery has room. Watch for the person's shadow.",
  }),
  page("crew-vehicles-wide", {
    title: "Unit vans and trucks in wide shots",
    summary: "Remove production vehicles parked in the distance of wide landscape shots.",
    tags: [T.crew, T.car],
    body: "Vans and trucks on the horizon are often static, so a patch from the same frame works. Match haze and distance softness, and remove any glint from their windows.",
  }),
  page("crew-passers-by-locked", {
    title: "Passers-by crossing a locked-off shot",
    summary: "Remove people who walk through a static shot with a temporal median of the frames.",
    tags: [T.crew],
    body: "With a locked camera, a median over many frames gives the empty background because each person covers any pixel only briefly. Use it under a roto of the walkers and add grain back.",
  }),
  page("floor-tape-cables", {
    title: "Cables and tape marks on the floor",
    summary: "Clean cables, cases and actors' floor marks left on the set.",
    tags: [T.crew, T.set],
    body: "Actors' marks are small pieces of coloured tape on the floor; cables snake to lamps. Clone along the floor texture, track to the floor plane and keep contact shadows of real props.",
  }),
  page("footprints-snow-sand", {
    title: "Footprints in snow and sand",
    summary: "Smooth out crew footprints and tyre tracks left in snow, sand or mud before a take.",
    tags: [T.crew, T.set],
    body: "Prints from earlier takes spoil a fresh landscape. Clone untouched surface over them with matching light direction, and keep the surface's sparkle or grain consistent across the patch.",
  }),

  // ---- screens and spill -------------------------------------------------------------------
  page("screen-flattening-green", {
    title: "Flattening an uneven green screen",
    summary: "Even out a patchy backing before keying by dividing the plate by an estimate of the clean screen.",
    tags: [T.uneven, T.green],
    houseMethodFor: ["uneven-screen"],
    parameterNames: ["screenBlur", "targetColour"],
    body: "Light falls off toward the edges of a backing and hot spots sit under the lamps. Estimate the clean screen by blurring the plate inside a screen mask and dividing by the blurred mask, divide the plate by that estimate and multiply by the target colour. The key then works with one setting across the frame.",
  }),
  page("screen-blue-falloff", {
    title: "Blue screen falloff at the edges",
    summary: "Handle a blue backing that gets darker and more purple toward the corners of frame.",
    tags: [T.uneven, T.blue],
    body: "Blue backings lose brightness faster than green ones away from the lights. Key the centre and the edges with separate settings and blend, or flatten first. Watch for noise lifted in the dark corners.",
  }),
  page("screen-tape-seams", {
    title: "Tape seams and joins in screens",
    summary: "Remove the lines where screen panels or cloth lengths are taped together.",
    tags: [T.uneven, T.green],
    body: "Joins show as thin lines, lighter or darker than the screen, often straight and vertical. Fill them from either side with a thin matte before the key, or let a flattened screen absorb them.",
  }),
  page("screen-creases-cloth", {
    title: "Creases and folds in a cloth backing",
    summary: "Fix diagonal shading from folds in a hanging cloth screen.",
    tags: [T.uneven],
    body: "Cloth screens hang with folds that catch light differently, making diagonal bands. A screen estimate with a small blur follows them; otherwise paint the backing smooth behind the subject before keying.",
  }),
  page("screen-extension", {
    title: "Extending a screen that does not fill frame",
    summary: "Fill the area outside a too-small backing so the key covers the whole frame.",
    tags: [T.uneven, T.green],
    body: "When the backing ends before the frame does, the studio walls and lights show. Draw a garbage matte around everything outside the backing and fill it with solid screen colour or replace that area directly in the comp.",
  }),
  page("spill-green-edges", {
    title: "Green spill on edges",
    summary: "Suppress the green light that the screen bounces onto the edges of the subject.",
    tags: [T.spill, T.green],
    body: "Edges pick up the screen colour. Limit green to the average of red and blue inside an edge matte, then correct the luminance the suppression removed so edges do not go dark.",
  }),
  page("spill-blue-hair", {
    title: "Blue spill in hair",
    summary: "Clean blue contamination in fine hair shot against a blue backing.",
    tags: [T.spill, T.blue, T.hair],
    body: "Fine hair lets the blue screen through. Suppress blue with a limit tied to green, and restore the hair's natural tone from a nearby unaffected area. Check against the final background.",
  }),
  page("spill-bounce-on-skin", {
    title: "Green bounce light on skin",
    summary: "Remove the green cast that a large screen throws onto faces and arms.",
    tags: [T.spill, T.skin, T.green],
    body: "Big screens light the cheeks and arms green even away from the edge. Pull a soft matte of the affected skin, neutralise the cast with a hue-limited correction and keep the skin tones consistent with the rest of the scene.",
  }),

  // ---- grain and noise ---------------------------------------------------------------------
  page("regrain-paint-patches", {
    title: "Putting grain back on paint patches",
    summary: "Patches painted on a denoised plate need the plate's own grain added back to blend in.",
    tags: [T.grain],
    houseMethodFor: ["grain-and-noise"],
    parameterNames: ["grainAmount"],
    body: "Paint and clone work on a denoised plate looks smooth and plastic. Take the difference between the original and the denoised plate, which is the grain, and add it back over the whole frame so the patch carries real grain. Never regrain twice.",
  }),
  page("denoise-before-keying", {
    title: "Denoise before keying",
    summary: "Key on a denoised copy of the plate so edges do not chatter, then restore the grain.",
    tags: [T.grain, T.green],
    body: "Noise in the screen makes the matte edge crawl from frame to frame. Key on a denoised copy, use the original plate for the picture, and add grain to any replaced background.",
  }),
  page("night-exterior-noise", {
    title: "Night exterior noise",
    summary: "Reduce heavy sensor noise in dark plates without losing detail in the blacks.",
    tags: [T.grain, T.night],
    body: "Night plates are shot at high sensitivity and the shadows swim with colour noise. Denoise the chroma harder than the luminance, protect edges and keep some noise so the shot matches the rest of the sequence.",
  }),
  page("grain-match-cg", {
    title: "Matching grain on added elements",
    summary: "Give CG elements and stills the same grain as the plate they are put into.",
    tags: [T.grain],
    body: "Clean elements in a grainy plate float. Measure the plate's grain per channel and per brightness, and add grain of the same size and strength to the element. Compare in a flat area at full resolution.",
  }),
  page("blue-channel-noise", {
    title: "Heavy noise in the blue channel",
    summary: "Treat the blue channel on its own when it carries much more noise than red and green.",
    tags: [T.grain],
    body: "Digital sensors often record blue with far more noise. Denoise blue alone, or rebuild its detail from green, and check the key, which usually uses blue for blue screens.",
  }),
  page("frozen-grain-held-patch", {
    title: "Frozen grain on held frames",
    summary: "A patch taken from one frame carries still grain that reads as a dirty window over the moving plate.",
    tags: [T.grain],
    body: "Holding a painted frame also holds its grain. Denoise the held frame before using it and add fresh moving grain on top, matched to the plate.",
  }),
  page("compression-macroblocking", {
    title: "Compression blocks in delivered plates",
    summary: "Soften square block edges from heavily compressed footage.",
    tags: [T.compression],
    body: "Low-bitrate files break smooth areas into 8 or 16 pixel squares. Deblock with a light filter along the block grid, or rebuild the worst areas with paint. Ask for a better source file first.",
  }),
  page("banding-gradients", {
    title: "Banding in smooth gradients",
    summary: "Break up visible steps in skies and walls after heavy grading.",
    tags: [T.compression, T.sky],
    body: "Smooth skies graded hard in 8-bit show steps. Work at 16-bit or float, add fine noise to dither the steps, and check on a calibrated display.",
  }),

  // ---- logos and signage -------------------------------------------------------------------
  page("logo-clothing", {
    title: "Logos on clothing",
    summary: "Remove brand marks from shirts, caps and shoes that move with the body.",
    tags: [T.logos],
    houseMethodFor: ["logos-and-signage"],
    body: "Clothing folds and moves. Track the logo with a planar track on the fabric, paint a clean patch that keeps the folds, and warp it where the cloth bends.",
  }),
  page("shop-signs-replacement", {
    title: "Shop signs and street signage",
    summary: "Replace or remove real shop names and street signs for clearance.",
    tags: [T.logos, T.set],
    body: "Flat signs track well with a planar track. Replace the lettering with cleared artwork or a blank board, match lighting and add dirt so it does not look new.",
  }),
  page("number-plates-cars", {
    title: "Number plates on cars",
    summary: "Swap registration plates on picture and background cars.",
    tags: [T.logos, T.car],
    body: "Plates are small, flat and shiny. Track the plate corners, replace with cleared numbers in the right font and match motion blur and reflections.",
  }),
  page("phone-laptop-screens", {
    title: "Phone and laptop screens",
    summary: "Replace the content and brand marks on devices held in shot.",
    tags: [T.logos],
    body: "Devices show interface and brand logos. Track the display corners, replace the picture and keep the fingers on top with roto. Paint out the maker's mark on the back.",
  }),
  page("posters-graffiti", {
    title: "Posters and graffiti on walls",
    summary: "Clear posters, tags and writing painted or pasted on walls in shot.",
    tags: [T.logos, T.set],
    body: "Paint the wall clean from nearby texture and track it. Keep the wall's weathering, and check the writing is gone from reflections and shadows too.",
  }),

  // ---- debris ------------------------------------------------------------------------------
  page("birds-planes-sky", {
    title: "Birds and planes in the sky",
    summary: "Remove birds, aircraft and other things flying through clear sky.",
    tags: [T.debris, T.sky],
    body: "Small flying things cross the sky in a few frames. Fill from neighbouring frames or from the sky around them, and add grain back. Check that their shadows or reflections are not elsewhere.",
  }),
  page("floating-rubbish-water", {
    title: "Floating rubbish on water",
    summary: "Clean litter and debris floating in rivers, harbours and pools.",
    tags: [T.debris, T.water],
    body: "Floating objects ride the ripples. Patch them with water taken from nearby and move it with the surface, or replace a region of water from a clean take.",
  }),
  page("insects-around-lights", {
    title: "Insects around lights at night",
    summary: "Remove moths and bugs that swarm through the light of lamps on night shoots.",
    tags: [T.debris, T.night],
    body: "Insects near a light show as bright streaks. Detect them as brief bright outliers over a temporal median and fill from neighbouring frames.",
  }),
  page("contrails-sky", {
    title: "Contrails across the sky",
    summary: "Take out long white aircraft trails that break a period setting.",
    tags: [T.debris, T.sky],
    body: "Trails are long, soft and slowly spreading. Paint the sky clean along the trail with a soft clone, keep the sky gradient and check neighbouring shots for the same trail.",
  }),

  // ---- lens problems -----------------------------------------------------------------------
  page("undistort-for-paint", {
    title: "Undistorting plates before paint work",
    summary: "Remove the lens distortion so patches and tracks line up, then put it back at the end.",
    tags: [T.distortion],
    houseMethodFor: ["lens-distortion"],
    body: "Wide lenses curve straight lines, so a flat patch does not fit near the frame edge. Undistort with the lens grid for that lens, paint and track on the straight plate, then redistort with the same data. Render an overscan so the corners do not go black.",
  }),
  page("straighten-wide-lens-lines", {
    title: "Straightening bowed architecture on wide lenses",
    summary: "Correct barrel or pincushion bending of door frames and horizons when no lens grid was shot.",
    tags: [T.distortion, T.set],
    body: "Without a grid, estimate the distortion from lines that must be straight: door frames, horizons, tiles. Fit the correction to them and check the centre of frame does not scale.",
  }),
  page("vignetting-dark-corners", {
    title: "Vignetting: evening out darker corners",
    summary: "Correct the darkening toward the corners of frame that some lenses and filters add.",
    tags: [T.vignetting],
    body: "Light drops toward the edges of the image. Measure the falloff on a flat frame, or fit a smooth radial shape, and divide the plate by it. Leave creative vignettes added in the grade alone.",
  }),
  page("vignetting-stitched-tiles", {
    title: "Vignetting in stitched tiles",
    summary: "Remove the corner darkening that repeats in each tile of a stitched panorama or matte painting source.",
    tags: [T.vignetting, T.sky],
    body: "Stitched tiles show a repeating pattern of darker corners. Flatten each tile before stitching with the same radial correction so the joins disappear.",
  }),
  page("chromatic-aberration-edges", {
    title: "Colour fringes on high-contrast edges",
    summary: "Realign red and blue against green to remove fringes from chromatic aberration.",
    tags: [T.aberration],
    body: "Cheap or wide lenses put red and blue edges on opposite sides of dark lines, worse toward the corners. Scale red and blue slightly around the centre until the fringes meet, or desaturate the fringe inside an edge matte.",
  }),
  page("moire-fabric", {
    title: "Moiré on fabric and fine patterns",
    summary: "Remove rippling interference patterns on striped shirts, screens and mesh.",
    tags: [T.moire],
    body: "Fine repeating patterns beat with the sensor grid and make coloured ripples that crawl. Blur the chroma only inside a matte of the pattern, or paint the fabric with its real texture from a frame where it did not beat.",
  }),
  page("moire-monitors-led", {
    title: "Moiré on monitors and LED walls",
    summary: "Calm the wavy bands that appear when the camera films a display.",
    tags: [T.moire, T.set],
    body: "Displays in shot produce large rolling bands. Replace the display content entirely, or blur the pattern away inside the screen area and re-add a clean picture.",
  }),
  page("lens-flare-removal", {
    title: "Removing lens flares",
    summary: "Take out flares and ghosts from lights pointing into the lens.",
    tags: [T.flare],
    body: "Flares add light on top of the picture. Subtract a soft model of the flare, then paint back the detail it hid. Ghost rings on the opposite side of the centre move against the light.",
  }),
  page("lens-ghosts", {
    title: "Lens ghosts from bright lights",
    summary: "Remove the coloured rings and shapes that bright sources create inside the lens.",
    tags: [T.flare],
    body: "Ghosts are internal reflections of the light source, mirrored through the frame centre. Track them against the light's position and paint them out, keeping the main flare if the shot needs it.",
  }),
  page("defocus-patch-match", {
    title: "Matching focus on a patch",
    summary: "Make a clean patch as soft as the out-of-focus area it covers.",
    tags: [T.distortion],
    body: "A sharp patch in a soft background stands out. Defocus the patch with a lens blur of the same size, match the bokeh shapes of highlights and add grain after the blur.",
  }),

  // ---- camera and sensor -------------------------------------------------------------------
  page("rolling-shutter-skew", {
    title: "Rolling shutter skew on fast pans",
    summary: "Straighten verticals that lean during fast camera moves on sensors that read line by line.",
    tags: [T.rollingShutter, T.motion],
    houseMethodFor: ["rolling-shutter"],
    body: "The sensor reads the top of the frame before the bottom, so vertical lines lean during a pan. Track the shot, estimate the lean per frame from the camera speed and shear the plate back. Objects moving fast across frame lean too.",
  }),
  page("flash-band-repair", {
    title: "Flash bands from camera flashes",
    summary: "Repair frames where a photographer's flash lit only part of the frame.",
    tags: [T.rollingShutter],
    body: "A flash during a rolling readout brightens only a band of the frame, often the bottom half of one frame and the top of the next. Combine the two half frames into one evenly lit frame, or grade the band back.",
  }),
  page("jello-wobble-vibration", {
    title: "Jello wobble from vibration",
    summary: "Remove the rubbery shake that vibration adds on car and drone mounts.",
    tags: [T.rollingShutter, T.motion, T.car],
    body: "High-frequency vibration makes the picture ripple like jelly. Track many points, solve a warp per frame that removes the high-frequency part and keep the intended camera move.",
  }),
  page("deflicker-practical-lights", {
    title: "Deflickering practical lights",
    summary: "Even out brightness that pulses from lamps and tubes on mains power.",
    tags: [T.flicker],
    houseMethodFor: ["flicker"],
    body: "Lights on mains power pulse at twice the mains frequency, and at some shutter speeds the plate beats. Measure the brightness of a stable area per frame and grade each frame to the smoothed curve, locally where only part of the frame pulses.",
  }),
  page("timelapse-exposure-flicker", {
    title: "Exposure flicker in time-lapse",
    summary: "Smooth the frame-to-frame brightness jumps of stills shot as a time-lapse.",
    tags: [T.flicker, T.sky],
    body: "Each still of a time-lapse is exposed a little differently. Measure average brightness per frame, fit a smooth curve over time and grade each frame onto it.",
  }),
  page("monitor-flicker-in-shot", {
    title: "Monitors and screens flickering in shot",
    summary: "Fix rolling bars and pulsing on television and computer screens filmed on set.",
    tags: [T.flicker, T.set],
    body: "Screens refresh out of step with the camera and show dark bars that roll. Replace the screen picture, or grade out the bar per frame inside a tracked screen matte.",
  }),
  page("firelight-flicker-on-patch", {
    title: "Matching firelight flicker on a patch",
    summary: "A patch lit by candles or fire must flicker along with the scene.",
    tags: [T.flicker],
    body: "Flicker that belongs to the scene must stay. Measure the brightness change of the area around the patch per frame and apply it to the patch so it pulses with its surroundings.",
  }),
  page("stabilise-before-paint", {
    title: "Stabilise, paint, then put the move back",
    summary: "Paint handheld shots on a stabilised plate and re-apply the shake afterwards.",
    tags: [T.motion],
    body: "Paint tracked to a shaking camera swims. Stabilise the plate on the area of work, paint on the still result and apply the inverse transform to the paint only. Watch for motion blur that stabilising cannot remove.",
  }),
  page("duplicate-dropped-frames", {
    title: "Duplicated and dropped frames",
    summary: "Rebuild missing frames and replace repeated ones in a damaged sequence.",
    tags: [T.film],
    body: "A repeated frame stutters, a missing one jumps. Replace a duplicate with an interpolation of its neighbours and check motion blur and fast movement by eye.",
  }),

  // ---- skin and beauty ---------------------------------------------------------------------
  page("beauty-blemishes", {
    title: "Blemish and spot cleanup on skin",
    summary: "Remove spots, cold sores and small marks on faces while keeping the skin texture.",
    tags: [T.beauty, T.skin],
    body: "Clone from nearby skin with matching pore size, track each patch and check it at full resolution in motion. Keep natural variation; an even surface looks fake.",
  }),
  page("tattoo-cover", {
    title: "Covering tattoos",
    summary: "Remove tattoos that the character should not have.",
    tags: [T.beauty, T.skin],
    body: "Tattoos cover large areas and wrap around muscles. Build a skin patch from the actor's own skin, warp it over the tattoo as the arm moves and grade to match light and shadow.",
  }),
  page("sweat-shine-skin", {
    title: "Sweat and shine on foreheads",
    summary: "Take the greasy shine off skin under hot lights.",
    tags: [T.beauty, T.skin],
    body: "Hot lights make foreheads and noses glisten. Pull a matte of the brightest skin highlights and bring them down toward the skin tone around them, keeping a little sheen.",
  }),
  page("earpiece-radio-mic", {
    title: "Hiding earpieces and radio mics",
    summary: "Paint out earpieces, mic packs and their cables on actors.",
    tags: [T.beauty, T.skin],
    body: "Small devices in ears and cables at collars move with the actor. Track each one, clone skin or costume over it and check close-ups frame by frame.",
  }),

  // ---- sky, water, atmosphere --------------------------------------------------------------
  page("sky-replacement-trees", {
    title: "Sky replacement behind trees",
    summary: "Put a new sky in behind foliage without hard edges.",
    tags: [T.sky],
    body: "Key the sky by its colour and brightness, refine the edges of leaves with a detail key, and let the new sky's light wrap the edges. Match grain and haze.",
  }),
  page("patching-moving-water", {
    title: "Patching on moving water",
    summary: "Paint fixes on waves and ripples that hold up in motion.",
    tags: [T.water],
    body: "Water never holds still. Take patches from a section of water with the same flow, retime them to match and blend at soft edges. A still patch on water is always visible.",
  }),
  page("paint-through-smoke", {
    title: "Paint work through smoke and haze",
    summary: "Fix things behind drifting smoke without losing the smoke.",
    tags: [T.set],
    body: "Separate the smoke from what it covers with a luminance key, paint the background, then lay the smoke back over it. Watch the density where the patch edge meets thick smoke.",
  }),
  page("rain-streaks", {
    title: "Thinning out rain streaks",
    summary: "Remove or reduce the rain from a rain machine where it hides faces.",
    tags: [T.water],
    body: "Rain is bright diagonal streaks that each last a frame or two. A temporal median removes most of them; add back a thinner rain so the shot still reads wet.",
  }),
];
