/**
 * Held-out search quality pages, second set (2026-12-05): forty invented Kestrel Yard write-ups in look-alike groups — heat haze, water and dirt on the lens, focus and defocus, screens, flicker causes, frame repair and cadence, blown highlights, skin, floors, signage and frame edges.
 * Written apart from the engine, its thesaurus and lexicon and every query set. Never tune on it.
 * Trade content is common practice, no published source.
 */
import type { SearchDocument } from "@/lib/search/types";
import { pageMaker, tag, TAGS } from "./pages";

const HAZE = tag("heat-haze", "Heat haze", "problem", ["shimmer", "heat shimmer"]);
const LENS_WATER = tag("water-on-lens", "Water on lens", "problem", ["rain on lens", "lens drops"]);
const DEFOCUS = tag("focus-and-defocus", "Focus and defocus", "problem", ["bokeh", "out of focus"]);
const SCREENS = tag("screen-replacement", "Screen replacement", "problem", ["screen insert", "phone screen"]);
const FRAME_REPAIR = tag("frame-repair", "Frame repair", "problem", ["dropped frame", "bad frame"]);
const INTERLACE = tag("interlace-and-pulldown", "Interlace and pulldown", "problem", ["combing", "cadence"]);
const HIGHLIGHTS = tag("blown-highlights", "Blown highlights", "problem", ["clipped highlights", "overexposure"]);

const page = pageMaker("vp");
const T = TAGS;

export const UNSEEN_PAGES_SECOND: SearchDocument[] = [
  // ── heat haze ──
  page("v-heat-haze-runway-warp", {
    title: "Heat haze over tarmac on a locked-off plate",
    summary: "Flatten ground shimmer on a static camera by warping each frame back onto a temporal median of the plate.",
    aliases: ["haze warp-back", "median warp"],
    tags: [HAZE, T.set],
    parameterNames: ["medianWindow", "warpSmoothing", "holdoutMatte"],
    shotCodes: ["KY_210_0040"],
    houseMethodFor: ["heat-haze"],
    body: "On a hot day with a long lens, anything past the middle distance wobbles: hangar edges ripple, painted lines on the tarmac crawl and fine detail smears from frame to frame. If the camera is locked off, build a reference by taking a median over fifteen to thirty frames; the wobble averages out and you get a steady, slightly soft frame. Then solve motion vectors from each frame to that reference and warp the frame onto it, so you keep the real grain and detail but lose the crawl. Smooth the vectors a little or you will warp the grain too. Anything that genuinely moves, a person walking or a plane taxiing, must be held out with a roto and left alone, or it will smear. Loop the edges of the holdout; that is where it breaks. Regrain if the warp softened the texture.",
  }),
  page("v-heat-haze-exhaust-plume", {
    title: "Exhaust shimmer behind a moving vehicle",
    summary: "Remove the localised heat distortion trailing from an exhaust or engine by patching the distorted region from tracked neighbouring frames.",
    aliases: ["exhaust distortion", "jet wash cleanup"],
    tags: [HAZE, T.car],
    parameterNames: ["patchOffsetFrames", "holdoutFeather"],
    shotCodes: ["KY_214_0110"],
    body: "This is not the whole-frame wobble you get off a hot runway. Here the distortion is a plume: a pocket of bending air behind a tailpipe, a generator flue or a jet engine, warping whatever sits behind it while the rest of the frame stays clean. A median warp will not help, because the plume travels with the vehicle. Track the background, then for each frame borrow the area under the plume from a frame several steps earlier or later, before the vehicle reached that spot, and reproject it through the track. Feather the patch generously; the plume has no hard edge. If the camera is following the vehicle the background is sliding, so check parallax on anything close. Leave a trace of shimmer if the director wants the engine to feel hot; fully clean often looks dead.",
  }),
  page("v-heat-haze-match-on-insert", {
    title: "Matching heat shimmer onto a clean inserted element",
    summary: "When the haze is part of the look, distort patches and inserted elements with the same shimmer so they sit in the plate.",
    aliases: ["shimmer match", "haze match"],
    tags: [HAZE, T.sky],
    parameterNames: ["distortionAmplitude", "noiseScale", "noiseSpeed"],
    shotCodes: ["KY_210_0090"],
    body: "Sometimes you are not removing haze at all. The desert plate shimmers, you have painted out a pylon or dropped in a clean building, and now your patch sits dead still while everything around it swims. Juniors often try to clean the whole plate to match the patch; it is usually quicker, and more honest, to give the patch the same shimmer. Measure the plate first: pick a sharp edge near your patch and watch how far it moves in pixels and how fast. Build a distortion from animated noise, stronger near the horizon and weaker near camera, and apply it to the patch only. Match the softness too, since haze blurs as well as bends. Flip between the patch edge and the plate around it; if the patch wobbles in step but looks sharper, add a touch of blur.",
  }),

  // ── water on the lens ──
  page("v-raindrops-locked-off", {
    title: "Raindrops sitting on the lens of a locked-off camera",
    summary: "Paint out static water drops on the front element by rebuilding the covered areas from a dry take or a drop-free stretch of the plate.",
    aliases: ["lens drop removal", "raindrop cleanup"],
    tags: [LENS_WATER, T.night],
    parameterNames: ["cleanPlateFrame", "dropMatteGrow"],
    shotCodes: ["KY_305_0020"],
    houseMethodFor: ["water-on-lens"],
    body: "Drops that land on the front element and stay put show as soft, round blurs, often with a bright rim, and each one refracts a small upside-down view of the scene. On a locked-off camera this is the easiest water problem you will get. Look for a take, or a stretch of this take, from before the drop landed; for a background that does not move, a single clean frame is often enough. Roto each drop a little larger than its visible rim, because the refraction halo spreads further than you think, and fill from the clean frame. If actors pass behind the drop you have to paint them back from neighbouring frames, which is slower. At night, check the practicals: a streetlight seen through a drop becomes a smeared star that must go too. Regrain the filled areas.",
  }),
  page("v-rain-sheeting-moving-camera", {
    title: "Water running down the lens on a moving camera",
    summary: "Clean streaks of water sliding down the front element during a handheld or car-mount shot by reprojecting tracked patches from other frames.",
    aliases: ["rain streak cleanup", "lens runoff"],
    tags: [LENS_WATER, T.car],
    parameterNames: ["trackReferenceFrame", "patchBlendWidth"],
    shotCodes: ["KY_305_0050"],
    body: "Once the camera moves and the water moves too, the easy fix is gone. Streaks slide down in frame space while the scene slides across underneath, so every pixel under a streak is hidden only briefly. Track the scene, not the water. For each frame, pull the hidden area from frames where that part of the world was visible and reproject it through the track; on car-mount shots that usually means looking a few frames ahead in the direction of travel. Streak edges carry a bright highlight and a dark line, and both must go. Where streaks merge into a sheet you may have no clean coverage at all, and a grade-led softening or a different take is the better call. Review at speed: a patch that sticks reads as a smudge sliding across the picture.",
  }),
  page("v-snowflake-lens-hits", {
    title: "Snowflakes landing on the lens and melting",
    summary: "Remove flakes that hit the front element, from the crisp white strike through to the soft melting blob that follows.",
    aliases: ["snow on lens", "flake hits"],
    tags: [LENS_WATER, T.debris],
    parameterNames: ["meltFrames", "flakeSizeMin"],
    shotCodes: ["KY_305_0140"],
    body: "Falling snow in the scene is wanted; snow on the lens is not. You can tell them apart because a flake on the glass is huge, out of focus and does not fall: it appears, sits, then over a second or two turns into a clear drop that slowly spreads. Treat the two phases separately. The first frames, while the flake is white and opaque, are a plain paint job from neighbouring frames, much like a large dust hit. The melting stage behaves like a water drop, with refraction and a soft rim, so fill it as you would a raindrop. Do not forget the thin wet trail if it slides. Keep the real falling snow over your patch; if the fill came from a frame with different flakes in it, you will see them pop. A luma key helps cut the patch around them.",
  }),

  // ── dirt on the glass ──
  page("v-smear-front-element", {
    title: "Greasy smear on the front element",
    summary: "Recover contrast and remove streaky flare caused by a fingerprint or grease smear on the lens, using a local grade rather than paint.",
    aliases: ["fingerprint on lens", "lens smear"],
    tags: [T.flare, T.vignetting],
    parameterNames: ["smearMask", "blackLift", "streakAngle"],
    body: "A smear does not look like dirt; it looks like fog in one part of the frame. Blacks lift, contrast drops, and any bright source nearby throws a streak at an odd angle, at right angles to the wipe marks. Because the smear sits in frame space and is large and soft, painting it out is the wrong tool. Map where the contrast is lost: follow a dark object as it moves through the affected area and compare it with how it looks elsewhere. Build a soft mask that follows that falloff and grade inside it, bringing the blacks down and the contrast back up. The streaks need separate treatment: isolate them with a key on brightness and direction, then subtract them or paint them from neighbouring frames. If the smear is heavy enough that detail is gone, no grade will bring it back; flag that early.",
  }),
  page("v-hair-in-the-gate", {
    title: "Hair in the gate on a film scan",
    summary: "Remove a hair or fibre caught in the camera gate that sits at the edge of frame and wriggles across a long run of frames.",
    aliases: ["gate hair", "gate fibre"],
    tags: [T.film, T.dust],
    parameterNames: ["edgeMatte", "frameRange"],
    shotCodes: ["KY_118_0070"],
    body: "A gate hair is not ordinary dust. Dust lands on one frame and vanishes; a hair caught in the gate stays for dozens or hundreds of frames, fixed near the edge of picture, usually a dark curly silhouette that twitches slightly as each frame is pulled down. Because it is in every frame of the run, taking picture from the frame before or after will not help. If the camera moves, reproject clean picture from frames where the area under the hair sat elsewhere in frame. If the camera is locked off and the area behind never changes, one clean painted frame is enough. Where the hair crosses action, you are rebuilding by hand. Before starting, check the delivery extraction: gate hairs often sit outside the final framing, and then nothing needs doing.",
  }),
  page("v-filter-dirt-fixed-spot", {
    title: "Soft dirt spot on a filter that stays put as the camera pans",
    summary: "Clean a faint blurry blob left by a speck on the filter or front glass, correcting its density before reaching for a fill.",
    aliases: ["filter dirt", "lens spot"],
    tags: [T.sensorDust, T.sky],
    parameterNames: ["spotCentre", "spotRadius", "densityGain"],
    body: "This gets mistaken for sensor dust all the time. Both stay fixed in frame while the camera moves. The difference: a speck on a filter or the front glass is much larger and softer, often a faint ring, and it changes size and softness when focus or iris changes, whereas sensor dust stays small and crisp. Both show up most against sky. Because the spot is semi-transparent, the cheapest fix is often not a fill but a density correction: measure how much it darkens the background and divide that back out through a soft circular matte. Try that first. If the picture through the spot has lost detail, fall back to filling it from the panning background through a track. Check a flat area at the head and tail of the shot, since an iris change alters the spot.",
  }),

  // ── focus and defocus ──
  page("v-lens-breathing-focus-pull", {
    title: "Lens breathing during a focus pull",
    summary: "Take out the framing change some lenses show when focus racks, by solving the scale change and counter-animating it.",
    aliases: ["focus breathing", "breathing fix"],
    tags: [DEFOCUS, T.motion, T.distortion],
    parameterNames: ["scaleCurve", "scaleCentre", "overscanPercent"],
    shotCodes: ["KY_402_0030"],
    body: "When the focus puller racks from a face in the foreground to someone behind, some lenses change their field of view, and the whole frame seems to zoom gently in or out although nobody touched the zoom. Audiences read it as a nervous camera. First confirm it is breathing and not a real dolly move: with breathing, everything scales about the lens centre with no parallax between near and far. Track several points spread across the frame and solve for scale only, ideally about the optical centre rather than the frame centre, then invert that curve. Scaling up loses the frame edges, so find out whether there is overscan or whether you will need edge fill. Check straight lines near the edges; if distortion changes with focus as well, a pure scale leaves a wobble there and the undistort belongs in the chain.",
  }),
  page("v-bokeh-practical-removal", {
    title: "Removing an unwanted light from the background bokeh",
    summary: "Paint out a defocused practical, such as an exit sign or stray lamp, that shows as a bokeh disc, and rebuild the blurred background around it.",
    aliases: ["bokeh cleanup", "defocused light removal"],
    tags: [DEFOCUS, T.night],
    parameterNames: ["defocusSize", "bokehShape"],
    shotCodes: ["KY_402_0110"],
    body: "Out of focus, a small bright light becomes a disc in the shape of the aperture, sometimes with a bright rim, and towards the frame edges it turns into a cat's-eye. Removing it looks simple, but the disc overlaps everything behind it and adds light over a wide area. A clone from nearby background gives itself away, because the blur texture differs. Build the fill in focus terms: take a patch of similar background, or paint a rough version, then defocus it with a kernel that matches the lens, checked against other discs in the frame. Where the disc overlaps other bokeh, those discs must be rebuilt too. Match the noise afterwards, since defocusing your patch smooths the grain away. Compare the overlap areas with the original frame with the gamma pushed up.",
  }),
  page("v-soft-foreground-crossing", {
    title: "Out-of-focus foreground object crossing the frame",
    summary: "Remove a heavily blurred foreground object, such as a shoulder or a stand close to the lens, whose semi-transparent edges bleed over the subject.",
    aliases: ["foreground wipe removal", "soft foreground cleanup"],
    tags: [DEFOCUS, T.crew],
    parameterNames: ["edgeFalloff", "cleanPlateOffset"],
    body: "A crew member's shoulder or a lamp stand close to the lens becomes a huge blurred shape, and the trouble is not the dense middle but the edges, which fade over many pixels and lie semi-transparently over the actors. A hard roto leaves a visible halo of the unwanted colour. Roto the object with a wide, graded edge that follows the real falloff. Treat the inner zone as full replacement from a clean plate or neighbouring frames, and the edge zone as an unmix: subtract the object's colour, weighted by the matte. The unmix only works if the object is fairly flat in colour. If it is patterned, or the subject behind is moving fast, rebuild the whole affected region instead. Review on a loop at normal speed; a faint ghost sliding through frame is easy to miss on stills.",
  }),

  // ── screens ──
  page("v-phone-screen-insert", {
    title: "Phone screen replacement with fingers over the glass",
    summary: "Track and insert new content onto a handheld phone display, keeping the thumb in front and putting the glass reflections back.",
    aliases: ["phone insert", "screen comp"],
    tags: [SCREENS, T.markers, T.reflections],
    parameterNames: ["cornerPinTrack", "reflectionMix", "screenGlow"],
    shotCodes: ["KY_230_0050"],
    houseMethodFor: ["screen-replacement"],
    body: "Phones are usually shot with a plain green or black screen and a few dots, and they move fast because they are in someone's hand. Track the four corners from the phone body rather than the screen, which has little detail; the dots help if they are there. Roto the fingers with a soft edge and a little motion blur. Do not paste the insert flat: a real display has its own gamma, a slight glow and a falloff at steep viewing angles, and the glass picks up reflections of the room. Pull those reflections from the original plate where the screen was dark and lay them back over the new content at a low mix. Paint out any dots left under the thumb. Check the corner lock at the most extreme tilt, and judge the screen brightness against the light on the actor's face.",
  }),
  page("v-monitor-keep-reflections", {
    title: "Replacing a desktop monitor while keeping its reflections",
    summary: "Swap the content on a static computer or control-room monitor and retain the room reflections seen in its glass.",
    aliases: ["monitor insert", "monitor comp"],
    tags: [SCREENS, T.reflections, T.set],
    parameterNames: ["reflectionExtract", "screenGamma"],
    shotCodes: ["KY_230_0080"],
    body: "A control room with twenty monitors is mostly a tracking job with one hard part: the reflections. A dark or switched-off monitor on set is a mirror, showing windows, people walking past and ceiling lights. Paste new content over it opaquely and the room looks dead. Before inserting, extract what is on the glass: where the screen was black, the plate is the reflection. Where the monitor was showing playback, you need a difference against the content that was on it, if you can get that from the playback operator. Put the new content under the reflection, graded so its brightness matches the practical screens around it. Watch for the moiré real monitors show on camera; if the neighbouring screens have it and yours does not, yours looks inserted.",
  }),
  page("v-crt-rolling-bar", {
    title: "Rolling bar on a tube television",
    summary: "Fix the dark band that crawls vertically over an old cathode-ray screen when its refresh does not match the camera shutter.",
    aliases: ["roll bar", "scan bar"],
    tags: [SCREENS, T.flicker],
    parameterNames: ["barPeriod", "barSpeed", "bandGain"],
    shotCodes: ["KY_118_0220"],
    body: "Period pieces put tube televisions in shot, and unless the camera was synced to the set, a dark horizontal bar rolls slowly up or down the screen. The bar is a brightness dip with soft edges and a steady speed, so it can be modelled. Stabilise the screen if the camera moves. Then measure the bar: its height, how dark it gets and how many pixels it travels per frame. Build a matching gradient band, animate it at that speed and use it to lift the screen back up. That keeps the real picture and its scan-line texture. If the bar is severe, or the screen content does not matter, it is quicker to replace the picture and add back the curvature, glow and scan lines. Check the corners of the screen, where the bar meets the tube's own falloff.",
  }),

  // ── flicker, by cause ──
  page("v-flicker-discharge-lamps", {
    title: "Mains flicker from discharge lamps",
    summary: "Smooth the regular pulsing caused by sodium, mercury or fluorescent fixtures beating against the frame rate.",
    aliases: ["lamp flicker", "mains flicker"],
    tags: [T.flicker, T.night],
    parameterNames: ["flickerPeriod", "regionCount", "smoothingWindow"],
    shotCodes: ["KY_305_0060"],
    body: "Street lamps, old fluorescent tubes and stadium lights pulse with the mains supply, and when that pulse beats against the camera shutter you get a slow, regular breathing in brightness, often only in the parts of the frame those lamps light. Plot the average brightness of a lamp-lit patch over time; a regular wave confirms the cause. A single global correction will fix the lamp-lit area and introduce flicker everywhere else, so split the frame into regions or use a mask of the lamp's throw. For each region, compute a smoothed brightness curve and correct towards it. If the colour shifts as well as the level, as it does with sodium lamps, correct each channel separately. Make sure actors moving through the lit area are not dragged into the correction, and check the lamp heads themselves.",
  }),
  page("v-flicker-timelapse-exposure", {
    title: "Stepped exposure jumps in a timelapse",
    summary: "Even out frame-to-frame brightness jumps in timelapse or interval plates caused by automatic exposure and shutter variation.",
    aliases: ["timelapse deflicker", "exposure stepping"],
    tags: [T.flicker, T.sky],
    parameterNames: ["referenceCurve", "outlierThreshold"],
    body: "Timelapse plates flicker for a different reason from lamp flicker. There is no regular wave; single frames jump brighter or darker because each exposure differed slightly, or because the camera's automatic exposure stepped as the light changed. The real change in light, a sunset say, is slow and must survive. Measure the average level of each frame, fit a smooth curve through those levels, and correct each frame towards the curve rather than towards a fixed value, or you will flatten the sunset. Measure on a stable area such as the ground or a building, not the sky, where moving cloud genuinely changes the brightness. Frames with a big one-off jump may have a different white balance too, so check each channel. Scrub through fast afterwards; leftover flicker is more obvious at speed.",
  }),
  page("v-led-wall-banding", {
    title: "Horizontal bands from an LED wall in camera",
    summary: "Remove the drifting light and dark bands that appear on an LED volume or video wall when its refresh and the camera shutter are out of step.",
    aliases: ["LED banding", "refresh banding"],
    tags: [T.flicker, T.rollingShutter, T.moire],
    parameterNames: ["bandFrequency", "bandPhase", "wallMatte"],
    shotCodes: ["KY_502_0010"],
    body: "On a stage with a video wall behind the actors, a shutter mismatch produces soft horizontal bands that drift across the wall, brighter and darker, sometimes with a colour tint. Unlike a tube television, the bands cover the whole wall, and with a rolling-shutter camera they tilt when the camera pans. Matte the wall first, with the actors held out. If the wall content exists as a file, the cleanest fix is to re-render it through the shot camera and replace the wall outright. If not, model the banding as a repeating gradient, estimate its spacing and phase per frame, and divide it out. Hair against the wall is the hard edge: the bands continue behind it, so correct softly under the edge matte. Look for moiré as well, since it often comes along with the banding.",
  }),
  page("v-firelight-keep-lamp-fix", {
    title: "Separating wanted firelight from unwanted lamp flicker",
    summary: "Remove a fixture's flicker while keeping the motivated flicker of flames or a television glow on the actors.",
    aliases: ["selective deflicker", "motivated flicker"],
    tags: [T.flicker, T.skin],
    parameterNames: ["keepMask", "sourceCurve"],
    body: "A campfire scene shot with a flickering work light in it is a common trap. Run a deflicker over the whole frame and it fights the firelight; faces go flat and lifeless. Start by deciding which light is the story. Mask the areas lit mainly by the fire, the faces on the fire side and the ground near the flames, and exclude them. Measure the unwanted flicker on something lit only by the problem fixture, such as a back wall, and apply that correction only where the fixture throws its light. Where both sources overlap, correct partially. If the fire itself flickers in a way that looks wrong, that is a conversation for the grade, not paint. Watch the skin on the fire side at speed; the flicker there should still look alive.",
  }),

  // ── bad frames and cadence ──
  page("v-dropped-frame-rebuild", {
    title: "Rebuilding a dropped or duplicated frame",
    summary: "Replace a missing or repeated frame in a plate with a frame interpolated from the motion on either side.",
    aliases: ["frame interpolation", "missing frame fix"],
    tags: [FRAME_REPAIR, T.motion],
    parameterNames: ["vectorQuality", "occlusionMatte", "shutterAngle"],
    shotCodes: ["KY_612_0080"],
    houseMethodFor: ["frame-repair"],
    body: "A recorder hiccup leaves a frame missing, so the motion jumps, or duplicated, so the motion sticks for a frame. Step through to find it; a duplicate shows up instantly as a blank difference against its neighbour. Check with editorial that the plate timing must stay, because usually you are rebuilding one frame in place. Solve motion vectors between the good frames either side and interpolate the middle one. Interpolation breaks wherever something emerges from behind something else, an arm swinging past a body for example, so matte those areas and patch them by hand from the nearer frame. Match the motion blur: a frame built from vectors is often too sharp next to its neighbours. Play the repair with a few frames either side at speed; a good fix is invisible, a bad one shows as a wobble.",
  }),
  page("v-corrupt-frame-blocks", {
    title: "Repairing a frame with block corruption",
    summary: "Fix a single frame where part of the image has broken into coloured blocks or shifted slices after a bad write or transfer.",
    aliases: ["corrupt frame", "glitch frame repair"],
    tags: [FRAME_REPAIR, T.compression],
    parameterNames: ["damageMatte", "sourceFrame"],
    body: "Sometimes the frame is there but damaged: a band of green or grey blocks, a slice shifted sideways, or the lower third frozen from the frame before. First ask for a fresh copy from the source; a re-transfer often comes back clean and saves you the work. If it does not, treat this differently from a dropped frame, because most of the frame is good and should be kept. Matte only the damaged area, with some margin, since corruption often bleeds a few pixels past where it looks broken. Fill that area from an interpolated frame, or straight from a neighbour if the motion is small, and match the grain. Check the whole frame, not just the obvious damage; a bad write sometimes shifts the colour of the top of the frame too.",
  }),
  page("v-interlace-combing", {
    title: "Combing on interlaced archive footage",
    summary: "Remove the comb-tooth artefacts on moving edges in interlaced video before paint, and rebuild full frames from the fields.",
    aliases: ["deinterlace", "field combing"],
    tags: [INTERLACE, T.compression],
    parameterNames: ["fieldOrder", "interpolationMode"],
    shotCodes: ["KY_118_0310"],
    houseMethodFor: ["interlace-and-pulldown"],
    body: "Archive video and old news footage are often interlaced: each frame holds two fields captured at different moments. On anything moving you see comb teeth along the edges, while static areas look fine. Do not paint on combed frames, because every stroke mixes two moments in time. Get the field order right first; if it is wrong, motion steps back and forth. Then build progressive frames from the fields, either one per field, which doubles the rate and keeps motion smooth, or one per frame, if the edit needs the original rate. Edge-aware interpolation gives the cleanest result. Do the paint on the progressive frames and, if the delivery must be interlaced, re-interlace at the very end. Check diagonal edges and fine text for jagged steps.",
  }),
  page("v-pulldown-removal", {
    title: "Reversing pulldown before cleanup",
    summary: "Detect the cadence of film material transferred to video at a higher rate and remove the inserted fields to recover the original frames.",
    aliases: ["pulldown removal", "inverse telecine", "cadence detection"],
    tags: [INTERLACE, T.film],
    parameterNames: ["cadenceOffset", "fieldOrder"],
    body: "Film transferred to video at a higher rate has extra fields inserted in a repeating pattern, so two out of every five video frames are mixtures. It looks like combing, but only on some frames and in a regular rhythm, and that rhythm is the clue. Deinterlacing this material is the wrong fix; it throws away resolution and makes the motion judder. Find the cadence by stepping through until you reach the first clean frame; the pattern repeats from there. Remove the pulldown to get back the original film frames, then do all the work on those. Watch for cadence breaks at edits, where the pattern restarts at a different offset, and give each section its own offset. If the delivery is at the video rate, reapply the same cadence at the end so it cuts with the surrounding edit.",
  }),

  // ── blown highlights ──
  page("v-blown-window-rebuild", {
    title: "Rebuilding a blown-out window behind dialogue",
    summary: "Replace a clipped white window in an interior with a separate exterior plate, and deal with the bloom around the frame.",
    aliases: ["window replacement", "blown window"],
    tags: [HIGHLIGHTS, T.set],
    parameterNames: ["clipThreshold", "bloomWidth", "windowTrack"],
    shotCodes: ["KY_230_0120"],
    houseMethodFor: ["blown-highlights"],
    body: "An interior exposed for faces often leaves the windows pure white, with no information at all. There is nothing to grade back, so the window has to be replaced. Key the clipped area on brightness, then refine the matte against the window frame and glazing bars by hand. The tricky part is the glow: light from an overexposed window spills over the frame, the bars and the edge of an actor's hair. Drop a correctly exposed exterior into a hard matte and you keep a white halo. Extend the replacement slightly into the glow and let the original bloom sit over it at a reduced level, so the window still feels bright. Track the window if the camera moves, and match the defocus of the exterior to the lens. Check the hair edges against the new view.",
  }),
  page("v-clipped-specular-car", {
    title: "Flat clipped highlights on car paint",
    summary: "Soften hard-edged clipped speculars on glossy bodywork so they roll off like real reflections instead of flat white shapes.",
    aliases: ["highlight roll-off", "specular repair"],
    tags: [HIGHLIGHTS, T.car, T.reflections],
    parameterNames: ["rollOffWidth", "fringeNeutralise"],
    shotCodes: ["KY_214_0150"],
    body: "Car commercials throw sunlight across glossy paint, and where the sensor clips, a reflection becomes a flat white shape with a hard edge, sometimes coloured where one channel clipped before the others. The fix here is not replacement. The highlight should stay bright but gain a natural falloff. Isolate the clipped core, where all channels hit the top, and the thin fringe where only one or two did. Neutralise the fringe so it does not go magenta or cyan. Then build a soft roll-off from the clip edge outwards, blending into the surrounding paint colour. Do not invent texture inside the highlight; a smooth fill reads as a reflection, painted detail reads as a mistake. Check while the car moves, since clipped shapes slide across the panels and the roll-off must travel with them.",
  }),
  page("v-blown-sky-hair-edge", {
    title: "Replacing a blown sky behind an actor's hair",
    summary: "Put a new sky into a clipped white exterior background while preserving the fine hair edge that the glare has eaten into.",
    aliases: ["sky replacement", "blown sky"],
    tags: [HIGHLIGHTS, T.sky, T.hair],
    parameterNames: ["edgeRecovery", "skyGrade", "lightWrap"],
    shotCodes: ["KY_214_0030"],
    body: "A white sky behind a face is easy to replace in the clear areas. The problem is the hair. Overexposure eats into fine strands and the outer wisps vanish into white, so a luma key gives a harsh, bitten edge. Key the sky, then build the hair edge in layers: a core matte for solid hair, and an edge matte that keeps the original brightness at low opacity so the wisps read as light catching hair. Where strands have been lost, paint a few back with a fine brush, following the direction of the hair. Grade the new sky to what the exposure suggests; a deep blue sky behind a glowing face looks pasted on. Add a little light wrap from the new sky onto the hair edge, and check it on both a dark and a bright monitor.",
  }),

  // ── skin ──
  page("v-sweat-shine-forehead", {
    title: "Knocking back sweat shine on a forehead",
    summary: "Reduce hot specular shine on oily or sweaty skin with a tracked, texture-preserving correction, without flattening the face.",
    aliases: ["shine removal", "matting down"],
    tags: [T.beauty, T.skin],
    parameterNames: ["shineThreshold", "textureDetail"],
    shotCodes: ["KY_230_0140"],
    body: "Under hot lights, foreheads, noses and top lips pick up a greasy shine, and make-up cannot always get in between takes. The shine is a bright, sometimes blown patch that moves with the face and shifts as the head turns. The aim is to bring it down, not remove it; skin needs some sheen to look alive. Track the area with a surface track on the face. Split the skin into a low-frequency colour layer and a high-frequency texture layer. Reduce the shine only in the colour layer, pulling its brightness towards the surrounding skin, and keep the texture. Where the shine is clipped, the texture underneath is gone, so borrow it from nearby skin. Check the moment the head turns and the shine slides, and check any profile angles.",
  }),
  page("v-tattoo-forearm-removal", {
    title: "Removing a tattoo from a moving forearm",
    summary: "Paint out a tattoo on a twisting arm by unwrapping the skin onto a stable reference, cleaning once, and reapplying through the track.",
    aliases: ["tattoo removal", "skin unwrap"],
    tags: [T.beauty, T.skin],
    parameterNames: ["meshResolution", "referenceFrame"],
    shotCodes: ["KY_402_0070"],
    body: "A tattoo on the forearm moves, twists and stretches as the actor gestures, and frame-by-frame paint will boil. Use a mesh or surface track to follow the skin, then unwrap each frame to a fixed reference, so the tattoo sits in the same place every frame. Paint it out once on the reference, borrowing skin from the other side of the arm for texture and tone, and warp the clean patch back onto the moving arm. Skin colour changes as the arm rotates through the light, so give the patch a per-frame grade sampled from nearby skin. Fine arm hair often crosses the tattoo lines; keep that hair texture in the patch. Check where the arm goes through motion blur, because a crisp patch on a blurred arm stands out at once.",
  }),
  page("v-mole-close-up", {
    title: "Taking out a mole in a close-up",
    summary: "Remove a small mole or blemish from a face in a close-up with a tracked texture patch that keeps pores and the small movements of skin.",
    aliases: ["blemish removal", "mole removal"],
    tags: [T.beauty, T.skin],
    parameterNames: ["patchRadius", "cloneOffset"],
    shotCodes: ["KY_402_0150"],
    body: "A mole is small, which makes it look easy, but in a close-up the audience is looking right at it. The patch has to carry pores, fine hair and the tiny shifts of skin as the actor talks. Track the mole with a planar or point track, adding a little local warp if it sits near the mouth or eyes, where skin stretches. Clone skin from just beside it, from an area with the same pore size and direction, not from the cheek on the other side of the face. Keep the clone source moving with the face so the grain and texture stay alive. Blend on a low-frequency colour layer so the tone matches. Some moles are part of an actor's look and continuity; confirm with the supervisor that it goes in every shot of the scene before you start.",
  }),
  page("v-tattoo-cover-showthrough", {
    title: "Fixing tattoo cover-up make-up that shows through",
    summary: "Tidy partial show-through where make-up covers a tattoo, using a colour correction inside a tracked mask instead of a full paint-out.",
    aliases: ["cover-up fix", "make-up correction"],
    tags: [T.beauty, T.skin],
    parameterNames: ["showThroughKey", "hueShift"],
    body: "When make-up covers a tattoo, the ink often ghosts through under certain lights as a faint blue-green outline, and the covered patch can read as a slightly different colour from the skin around it. There is no need to paint out a tattoo that is mostly covered; that wastes time and risks boiling. Key the show-through on its hue, which is usually well away from skin, track a soft mask over the area, and push the keyed hue back towards skin. Even out the tone of the covered patch against its surroundings. If the make-up edge has lifted or creased, treat that spot with a little paint. This only works while the ink is faint. Where it shows strongly, switch to a full unwrap and paint-out. Check under the warmest and coolest lights in the scene.",
  }),

  // ── floors ──
  page("v-dolly-track-polished-floor", {
    title: "Painting out dolly track on a polished floor",
    summary: "Remove dolly track laid across a glossy floor, including the rails' reflections and the floor pattern that runs under them.",
    aliases: ["track removal", "dolly track"],
    tags: [T.wire, T.set, T.reflections],
    parameterNames: ["floorTrack", "reflectionMatte"],
    shotCodes: ["KY_612_0020"],
    body: "When the camera turns far enough to see its own track, you get two rails running across the floor, and on a polished floor they reflect too. The camera is moving on that track, so use a camera solve or a planar track of the floor. Build a clean floor on one unwrapped frame, continuing the tiles, boards or marble pattern through where the rails sit, and project it back through the track. The floor's reflections matter as much as the rails: the reflection of an actor or a wall runs across where the rails were, and your clean floor has to carry it. Take that reflection from frames where it was clear, or build it as a separate layer. Watch for the rails' contact shadows and any sandbags beside them. Check the pattern for drift at the far end of the move.",
  }),
  page("v-stunt-crash-mats", {
    title: "Removing crash mats from a stunt landing",
    summary: "Replace the safety mats under a fall with clean ground, and rebuild the impact and contact shadow on the real surface.",
    aliases: ["mat removal", "safety mat cleanup"],
    tags: [T.wire, T.set],
    parameterNames: ["cleanPlateAlign", "contactShadow"],
    shotCodes: ["KY_502_0120"],
    body: "Stunt falls land on thick crash mats, and the mats are usually in frame at the landing. You need a clean plate of the ground from the same position, which the crew should have shot. Align it to the action plate; if the camera moves, track both and match them. The hard part is the performer on the mat. The mat compresses, so the performer ends up lower than the real ground would put them, and you may need to lift them slightly, frame by frame, so the contact sits on the clean ground. Build a contact shadow and some dust or debris for the impact, matched to the surface, and make sure none of the mat's own shadow survives. Review the landing at speed; the audience watches the body hit, and a floaty landing gives the trick away.",
  }),
  page("v-floor-tape-marks", {
    title: "Actor and focus marks left on the floor",
    summary: "Clean coloured tape and chalk marks used for actor positions and focus distances from floors, in shots where nobody lifted them.",
    aliases: ["tape marks", "floor marks"],
    tags: [T.markers, T.set],
    parameterNames: ["markMatte", "floorTexture"],
    shotCodes: ["KY_230_0210"],
    body: "Actor marks are small coloured tape T-shapes or chalk lines on the floor, and focus marks are similar strips, on the floor or on furniture. Crews usually lift them for wide shots, but some get missed. They look like tracking markers, yet they were never placed for tracking and often sit on textured surfaces: carpet, rough boards, gravel. Track the floor surface and patch each mark from nearby floor with matching texture and perspective. On carpet, watch the pile direction, because flipped texture shows. Chalk leaves a faint smudge, so paint that out as well. When an actor is standing on a mark, clean only the visible ends; there is no need to fix what nobody can see. Check the whole shot, as marks often appear later when actors step off them.",
  }),
  page("v-puddle-crew-reflection", {
    title: "Crew reflected in a puddle",
    summary: "Remove crew, lamps or the camera seen in the reflection of a puddle or wet street, keeping the rippled reflection moving.",
    aliases: ["puddle reflection", "wet street reflection"],
    tags: [T.reflections, T.water, T.crew],
    parameterNames: ["rippleDistortion", "reflectionClean"],
    shotCodes: ["KY_305_0090"],
    body: "Streets are often wetted down for night exteriors, and a puddle near camera reflects whatever is behind the camera: the crew, lamps on stands, a truck. The reflection is broken up by ripples and dimmed by the water. Do not paint on the water surface directly; the ripples move and paint will fight them. Instead, rebuild what the reflection should show, usually the buildings across the street, flip it, and put it through the same ripple distortion, taken from the original by tracking the surface movement or matched with animated noise. Blend it in at the same dimming and colour. Raindrops on the puddle break the reflection into rings; keep those rings on top of your rebuild. Check the puddle's edge, where the reflection meets the kerb or tarmac.",
  }),

  // ── signage and labels ──
  page("v-number-plate-replace", {
    title: "Replacing a number plate on a moving car",
    summary: "Track a vehicle's registration plate and swap it for an invented one, matching lighting, dirt and motion blur.",
    aliases: ["plate swap", "registration replacement"],
    tags: [T.logos, T.car],
    parameterNames: ["plateTrack", "motionBlurMatch", "dirtLayer"],
    shotCodes: ["KY_214_0170"],
    body: "Real registrations usually have to go, for legal reasons or because the story needs a particular plate. Track the plate with a planar track, taking care as it passes through reflections or shadows, which can drag the track off. Build the new plate at the right size, in the style the story's region would use, and age it to match the car: grime along the bottom, a faint reflection, a few chips. Match its lighting by sampling the original's brightness over time, since it changes as the car passes under lights, and add motion blur to match. Watch for the plate reflected in another car's bodywork or a shop window; that reflection must change too. Check the frames where the plate is tiny, where it should blur softly rather than shimmer.",
  }),
  page("v-costume-label-removal", {
    title: "Removing a brand label from a costume",
    summary: "Paint out a visible brand patch or label on clothing that folds and creases as the actor moves.",
    aliases: ["costume logo removal", "label cleanup"],
    tags: [T.logos],
    parameterNames: ["clothMesh", "foldShading"],
    shotCodes: ["KY_612_0110"],
    body: "A brand label on a jacket or a trainer is a logo on a surface that folds, and a planar track slides off as soon as the cloth creases. Use a mesh track over the fabric, or several small planar tracks in pieces, and unwrap the label area to a fixed reference. Paint the label out on that reference using the fabric beside it, matching the weave or knit. Then keep the folds: the cloth's shading crosses the label, and if you replace it flat, the folds stop dead at your patch. Separate the shading by dividing the plate by a smoothed copy of itself, and reapply it over the patch. Check stitching and seams; if a seam ran through the label, continue it. At speed, look for the patch swimming against the cloth.",
  }),
  page("v-shop-sign-rename", {
    title: "Renaming a shop front in a street plate",
    summary: "Replace the name on a storefront sign with an invented one, matching the lettering style, weathering and the light on the fascia.",
    aliases: ["sign replacement", "shop front change"],
    tags: [T.logos, T.set],
    parameterNames: ["signTrack", "weathering"],
    shotCodes: ["KY_612_0140"],
    body: "A street scene with a real shop name needs a new sign. This is bigger than a logo patch: you are replacing a whole fascia, often with lettering that has depth and casts shadows. Track the fascia with a planar track or a camera solve, depending on the move. Paint out the old lettering first, including its shadows and fixings, to get a clean board. Design the new name in a similar style and period, give it some thickness if the original letters had it, and light it to match the direction of the sun. Weather it to the same degree as the rest of the street, with dust along the tops of the letters and rain streaks below. If the sign is lit at night, add its glow on the pavement. Check for the old name reflected in windows across the street.",
  }),

  // ── frame edges and camera moves ──
  page("v-crash-zoom-stabilise", {
    title: "Stabilising a crash zoom without killing the move",
    summary: "Remove the jolt and sideways shake of a fast handheld zoom while keeping the energy of the zoom itself.",
    aliases: ["crash zoom smoothing", "zoom stabilisation"],
    tags: [T.motion],
    parameterNames: ["smoothingWindow", "scaleLock", "maxCorrection"],
    shotCodes: ["KY_502_0060"],
    body: "A crash zoom is meant to feel sudden, and a bump at the end is often part of the style. Trouble starts when the operator's hand jerks the frame sideways as the zoom lands and the subject jumps away from where the director framed it. Track the subject through the zoom, solving position, scale and rotation. Leave the scale curve as it is; that is the zoom. Smooth only position and rotation, with a short window so the end still lands sharply. Limit the size of the correction, because large corrections need big edge fills and start to look synthetic. The motion blur in the plate will not match the corrected motion exactly, but in a crash zoom the blur is mostly radial and usually gets away with it. Check the frames just after landing, where the correction is largest.",
  }),
  page("v-edge-fill-after-stabilise", {
    title: "Filling black edges after stabilisation",
    summary: "Fill the empty borders revealed when a plate is stabilised or repositioned, using picture borrowed from neighbouring frames.",
    aliases: ["edge fill", "border fill"],
    tags: [T.motion],
    parameterNames: ["fillSourceRange", "edgeFeather"],
    body: "Every time you move a frame to stabilise it, black wedges appear at the edges. The quick fix is to scale up until they are gone, but that softens the picture and crops the composition. Fill them instead. Because the camera was moving, the missing picture at the edge was usually visible in neighbouring frames. Track the background and reproject those frames into the gaps, nearest frames first, and feather the joins. Where there is parallax, foreground objects will not line up, and it is often better to scale slightly and fill less. If something moves through the edge area, a person walking in for instance, you cannot borrow it from other frames; paint it or crop. Watch the fill regions at speed, since jumps at the frame edge are more visible than you would expect.",
  }),
  page("v-black-border-overscan", {
    title: "Black borders and overscan in delivered plates",
    summary: "Sort out plates that arrive with black bars, dark gate edges or extra overscan picture before any cleanup begins.",
    aliases: ["overscan", "letterbox bars", "active area"],
    tags: [T.vignetting, T.film],
    parameterNames: ["activeArea", "overscanMargin"],
    shotCodes: ["KY_118_0010"],
    body: "Some plates arrive with black at the edges: a few lines of dead area from the camera, a soft dark edge from the scanner gate, or letterbox bars baked in by a transfer. Others carry overscan, extra picture beyond the framing lines. Before any paint, find the true active area by viewing a flat frame at high gain, and write it down. Dead edges should be cropped or filled before tracking, because they confuse trackers and get pulled into clone sources. Overscan should be kept; it helps stabilisation and edge fill later on. Do not confuse a dark edge with lens vignetting: vignetting is a smooth falloff, while a gate edge is sharp and uneven. Look at the framing chart if there is one, and confirm the delivery extraction with the supervisor.",
  }),
];
