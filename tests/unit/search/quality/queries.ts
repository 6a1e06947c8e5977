/**
 * Junior queries for the search quality set (issue 16), in four kinds:
 * - plain: names the problem in ordinary words;
 * - typo: misspelt, split or run-together words, as typed in a hurry;
 * - describe: says what is on the plate instead of naming the problem;
 * - filler: a whole question ("how do i get rid of …").
 * Written as a junior would ask, before the engine was tuned and without looking at the thesaurus;
 * each says why its page is the right answer (trade judgement: common practice, no published
 * source). Every fourth query of each kind is HELD OUT: it was not looked at while tuning, and the
 * benchmark reports it separately (`isHeldOut`).
 */
export type QueryKind = "plain" | "typo" | "describe" | "filler";
export type QualityQuery = { kind: QueryKind; query: string; expected: string; reason: string };

/** One query of a set written query by query (the unseen sets). */
export const qualityQuery = (kind: QueryKind, query: string, expected: string, reason: string): QualityQuery => ({ kind, query, expected, reason });

type Row = [query: string, expected: string, reason: string];

const plain: Row[] = [
  ["green screen markers", "markers-green-matrix", "the department's marker method, on green"],
  ["markers on blue screen", "markers-blue-matrix", "the blue backing version of the marker method"],
  ["tracking markers camera moving", "markers-moving-camera-planar", "a travelling camera is what the planar method is for"],
  ["markers static camera", "markers-locked-off-held-frame", "a static camera means one held clean frame"],
  ["markers on a brick wall", "markers-walls-floors", "markers on a real set surface, not a screen"],
  ["dots on actors face", "markers-face-dots", "facial tracking dots"],
  ["marker behind hair", "markers-hair-motion-blur", "hair crossing a marker"],
  ["cones on the grass", "markers-location-ground", "tracking cones on location ground"],
  ["wire removal sky", "wire-over-sky", "wire over a smooth sky"],
  ["wire in front of trees", "wire-busy-background-offset", "busy background behind the wire"],
  ["wire over the actors costume", "wire-across-actor", "the wire crosses the performer"],
  ["harness showing under clothes", "wire-harness-bulges", "harness lumps under costume"],
  ["blurry wire fast stunt", "wire-motion-blurred", "motion-blurred wire in a fast stunt"],
  ["wire in front of moving clouds", "wire-against-moving-clouds", "the background moves behind the wire"],
  ["rig removal clean plate", "rig-clean-plate", "rig removal using a clean pass"],
  ["rig but no clean plate", "rig-rebuild-background", "rebuilding the background without a clean pass"],
  ["light stand in the corner", "rig-light-stands-frame-edge", "lighting stand at the frame edge"],
  ["stunt mats", "rig-crash-mats", "crash mats put down by the stunt team"],
  ["puppet rods", "rig-puppet-rods", "rods moving a puppet"],
  ["car on a trailer tow bar", "rig-tow-bar-car", "towing rig on car shots"],
  ["dolly track", "rig-dolly-track", "camera dolly rails in shot"],
  ["film dust", "dust-busting-film-scans", "dirt on scanned film"],
  ["scratch on film", "film-scratch-vertical", "a scratch running down a film scan"],
  ["sensor dust", "sensor-dust-fixed-spots", "the page about sensor dust, not the film dust method"],
  ["rain drops on lens", "lens-dirt-water-drops", "water drops on the lens"],
  ["hair in gate", "gate-hair-edge", "a hair caught in the film gate"],
  ["dead pixels", "dead-pixel-repair", "dead and stuck pixel repair"],
  ["hot pixels night", "hot-pixels-dark-plates", "hot pixels in dark plates"],
  ["boom mic in shot", "boom-mic-in-frame", "the boom dips into frame"],
  ["boom shadow", "boom-shadow-wall", "the boom's shadow on a wall"],
  ["reflection in car", "reflection-car-bodywork", "crew reflected in car bodywork"],
  ["reflection in window", "reflection-window-glass", "reflections in window glass"],
  ["reflection in eyes", "reflection-in-eyes", "camera reflected in eyes"],
  ["remove people background", "crew-people-background", "people in the background"],
  ["trucks in the distance", "crew-vehicles-wide", "unit vehicles far away in a wide"],
  ["footprints in snow", "footprints-snow-sand", "prints in snow"],
  ["uneven green screen", "screen-flattening-green", "flattening an uneven screen"],
  ["green spill", "spill-green-edges", "green spill on edges"],
  ["blue spill hair", "spill-blue-hair", "blue spill in hair"],
  ["regrain", "regrain-paint-patches", "putting grain back on patches"],
  ["denoise before key", "denoise-before-keying", "denoising before keying"],
  ["grain on cg", "grain-match-cg", "matching grain on added elements"],
  ["logo on t-shirt", "logo-clothing", "logos on clothing"],
  ["number plate", "number-plates-cars", "number plates on cars"],
  ["birds in the sky", "birds-planes-sky", "birds in sky"],
  ["lens distortion", "undistort-for-paint", "the department's lens distortion method"],
  ["vignetting", "vignetting-dark-corners", "vignetting correction"],
  ["chromatic aberration", "chromatic-aberration-edges", "colour fringes from chromatic aberration"],
  ["moire on a striped shirt", "moire-fabric", "moiré on fabric"],
  ["rolling shutter", "rolling-shutter-skew", "the department's rolling shutter method"],
  ["flicker", "deflicker-practical-lights", "the department's flicker method"],
  ["lens flare", "lens-flare-removal", "removing a flare"],
  ["tattoo removal", "tattoo-cover", "covering tattoos"],
  ["sky replacement", "sky-replacement-trees", "replacing the sky"],
  ["moire on monitor", "moire-monitors-led", "moiré on displays"],
  ["compression artifacts", "compression-macroblocking", "compression blocks"],
];

const typo: Row[] = [
  ["trackign markers grene screen", "markers-green-matrix", "transposition and a wrong vowel"],
  ["markrs on blu screen", "markers-blue-matrix", "dropped letters"],
  ["tracking dots on fcae", "markers-face-dots", "transposed 'face'"],
  ["markers on the flor", "markers-walls-floors", "dropped letter in 'floor'"],
  ["wire remval sky", "wire-over-sky", "dropped letter in 'removal'"],
  ["wires infront of trees", "wire-busy-background-offset", "run-together 'in front'"],
  ["harnes under costume", "wire-harness-bulges", "dropped letter in 'harness'"],
  ["rig removel with clean plate", "rig-clean-plate", "misspelt 'removal'"],
  ["lite stand in frame", "rig-light-stands-frame-edge", "phonetic 'lite'"],
  ["puppet rodds", "rig-puppet-rods", "doubled letter"],
  ["dust busting scaned film", "dust-busting-film-scans", "dropped letter in 'scanned'"],
  ["vertical scrach film", "film-scratch-vertical", "dropped letter in 'scratch'"],
  ["sensr dust", "sensor-dust-fixed-spots", "dropped letter in 'sensor'"],
  ["dead pixle", "dead-pixel-repair", "transposition in 'pixel'"],
  ["hot pixles in the dark", "hot-pixels-dark-plates", "transposition in 'pixels'"],
  ["dead colum on sensor", "dead-sensor-column", "dropped letter in 'column'"],
  ["boom mik in frame", "boom-mic-in-frame", "phonetic 'mik'"],
  ["shaddow of the crew on the ground", "crew-shadow-ground", "doubled letter in 'shadow'"],
  ["reflexion in car door", "reflection-car-bodywork", "old spelling 'reflexion'"],
  ["relfection in shop window", "reflection-window-glass", "transposition"],
  ["reflections in sunglases", "reflection-sunglasses-visor", "dropped letter"],
  ["refelction in puddle", "reflection-water-surface", "transposition"],
  ["camera in the miror", "reflection-mirror-shot", "dropped letter in 'mirror'"],
  ["peple in backround", "crew-people-background", "two dropped letters"],
  ["foot prints in the sand", "footprints-snow-sand", "compound typed as two words"],
  ["unevan green screen", "screen-flattening-green", "wrong vowel"],
  ["blue screen fall off", "screen-blue-falloff", "compound split in two"],
  ["seems in green screen", "screen-tape-seams", "homophone typed for 'seams'"],
  ["creeses in cloth screen", "screen-creases-cloth", "wrong vowels in 'creases'"],
  ["green spil on edges", "spill-green-edges", "dropped letter"],
  ["blue spil in hair", "spill-blue-hair", "dropped letter"],
  ["regrane patch", "regrain-paint-patches", "phonetic 'regrane'"],
  ["denoize before keying", "denoise-before-keying", "z for s"],
  ["noize at night", "night-exterior-noise", "z for s"],
  ["grian on cg", "grain-match-cg", "transposition"],
  ["compresion blocks", "compression-macroblocking", "dropped letter"],
  ["bandng in sky", "banding-gradients", "dropped letter"],
  ["logo on tshirt", "logo-clothing", "run-together 't-shirt'"],
  ["numberplate on car", "number-plates-cars", "run-together 'number plate'"],
  ["grafiti on wall", "posters-graffiti", "dropped letter"],
  ["brids in sky", "birds-planes-sky", "transposition"],
  ["rubish floating in river", "floating-rubbish-water", "dropped letter"],
  ["lens distortian", "undistort-for-paint", "wrong vowel"],
  ["vignneting", "vignetting-dark-corners", "doubled the wrong letter"],
  ["cromatic abberation", "chromatic-aberration-edges", "two misspellings"],
  ["moiray on shirt", "moire-fabric", "spelt as it sounds"],
  ["roling shutter", "rolling-shutter-skew", "dropped letter"],
  ["flikker from lights", "deflicker-practical-lights", "phonetic 'flikker'"],
  ["time lapse flicker", "timelapse-exposure-flicker", "compound split"],
  ["lens flair", "lens-flare-removal", "homophone 'flair'"],
  ["stablize handheld shot", "stabilise-before-paint", "dropped letter, American ending"],
  ["tatoo on arm", "tattoo-cover", "dropped letter"],
  ["earpeice on actor", "earpiece-radio-mic", "ie/ei swap"],
  ["sky replacment trees", "sky-replacement-trees", "dropped letter"],
  ["rain streeks", "rain-streaks", "phonetic 'streeks'"],
];

const describe: Row[] = [
  ["little pink crosses on the green wall", "markers-green-matrix", "pink tape markers on a green backing"],
  ["white crosses on blue background", "markers-blue-matrix", "white tape markers on blue"],
  ["x shapes on screen and camera is moving around", "markers-moving-camera-planar", "markers with a travelling camera"],
  ["black dots stuck on the actors cheeks", "markers-face-dots", "facial tracking dots"],
  ["orange things on the ground outside for tracking", "markers-location-ground", "cones on location"],
  ["thin line above the stunt guy against blue sky", "wire-over-sky", "a wire over sky"],
  ["thin black line hanging down in front of the trees", "wire-busy-background-offset", "a wire over a busy background"],
  ["lumpy bits under his jacket from the flying straps", "wire-harness-bulges", "harness under costume"],
  ["big metal arm in the middle of the shot", "rig-clean-plate", "a large rig needing a clean pass"],
  ["legs of a tripod thing at the edge of frame with sandbags", "rig-light-stands-frame-edge", "a stand at the frame edge"],
  ["blue mattress on the floor where the stuntman lands", "rig-crash-mats", "a crash mat"],
  ["sticks moving the puppet around", "rig-puppet-rods", "puppet rods"],
  ["rails on the floor the camera rides on", "rig-dolly-track", "dolly track"],
  ["little white spots popping up on single frames of the scan", "dust-busting-film-scans", "one-frame film dirt"],
  ["line running down the picture for many frames", "film-scratch-vertical", "a persistent vertical scratch"],
  ["grey blob in the same spot in every shot of the sky", "sensor-dust-fixed-spots", "sensor dust does not move"],
  ["blurry drops on the front of the camera from rain", "lens-dirt-water-drops", "water on the lens"],
  ["squiggly dark thing at the edge of the frame wiggling", "gate-hair-edge", "a gate hair"],
  ["one pixel always white in the same place", "dead-pixel-repair", "a stuck pixel"],
  ["red and green sparkly pixels in the dark night shot", "hot-pixels-dark-plates", "hot pixels"],
  ["perfectly straight one pixel line top to bottom", "dead-sensor-column", "a dead sensor column"],
  ["black squares in the tv wall behind them", "led-wall-dead-leds", "dead LED modules"],
  ["microphone poking in at the top", "boom-mic-in-frame", "boom in frame"],
  ["dark moving patch on the wall from the sound guy", "boom-shadow-wall", "boom shadow on a wall"],
  ["our own shadows on the road", "crew-shadow-ground", "crew shadows on the ground"],
  ["dark band across her face from a flag", "flag-shadow-on-face", "a flag's shadow on a face"],
  ["shiny guy in the car door", "reflection-car-bodywork", "crew reflected in a car"],
  ["you can see the camera guy in the shop glass", "reflection-window-glass", "crew reflected in shop glass"],
  ["the light panel shows up in his eyes", "reflection-in-eyes", "a light reflected in the eyes"],
  ["crew visible in the pilots helmet", "reflection-sunglasses-visor", "crew in a visor"],
  ["someone walking behind the actors far away", "crew-people-background", "a person in the background"],
  ["an elbow sticking in at the side", "crew-member-frame-edge", "crew at the frame edge"],
  ["white vans parked on the hill", "crew-vehicles-wide", "unit vehicles in a wide"],
  ["tourists walking through and the camera doesnt move", "crew-passers-by-locked", "passers-by on a locked shot"],
  ["wires and tape on the floor", "floor-tape-cables", "cables and floor marks"],
  ["the green is brighter in the middle and dark at the sides", "screen-flattening-green", "an uneven screen"],
  ["purple corners on the blue", "screen-blue-falloff", "blue screen falloff"],
  ["lines where the screen pieces join", "screen-tape-seams", "screen seams"],
  ["diagonal shading on the hanging screen", "screen-creases-cloth", "folds in a cloth screen"],
  ["studio wall visible past the green", "screen-extension", "screen does not fill frame"],
  ["green outline around the actor", "spill-green-edges", "green spill on edges"],
  ["her face looks green from the screen", "spill-bounce-on-skin", "green bounce on skin"],
  ["the paint fix looks too clean and smooth", "regrain-paint-patches", "a patch without grain"],
  ["edges of the key crawling", "denoise-before-keying", "noisy key edges"],
  ["the cg looks too clean next to the plate", "grain-match-cg", "CG without grain"],
  ["square blocks in the dark areas", "compression-macroblocking", "compression blocks"],
  ["stripes in the sky gradient", "banding-gradients", "banding"],
  ["brand on his cap", "logo-clothing", "a logo on clothing"],
  ["company name on the shop front", "shop-signs-replacement", "a shop sign"],
  ["writing sprayed on the wall", "posters-graffiti", "graffiti"],
  ["something flying across the sky", "birds-planes-sky", "birds or planes"],
  ["plastic bottles in the harbour", "floating-rubbish-water", "floating rubbish"],
  ["doors look curved near the edge of frame", "straighten-wide-lens-lines", "bowed lines from a wide lens"],
  ["corners of the picture are darker", "vignetting-dark-corners", "vignetting"],
  ["red and blue edges on the window frames", "chromatic-aberration-edges", "colour fringes"],
  ["weird rainbow ripples on his striped shirt", "moire-fabric", "moiré on fabric"],
  ["buildings lean when the camera whips", "rolling-shutter-skew", "rolling shutter skew"],
  ["half the frame is bright from a camera flash", "flash-band-repair", "a flash band"],
  ["picture wobbles like jelly on the car mount", "jello-wobble-vibration", "jello from vibration"],
  ["the lights keep pulsing brighter and darker", "deflicker-practical-lights", "light flicker"],
  ["tv in the background has rolling bars", "monitor-flicker-in-shot", "a monitor flickering in shot"],
  ["forehead is all shiny", "sweat-shine-skin", "shine on skin"],
  ["ghost rings from the sun", "lens-ghosts", "lens ghosts"],
  ["thing in his ear", "earpiece-radio-mic", "an earpiece"],
];

const filler: Row[] = [
  ["how do i get rid of the markers on a green screen", "markers-green-matrix", "markers on green"],
  ["i need to take out tracking markers on blue screen", "markers-blue-matrix", "markers on blue"],
  ["whats the best way to do markers when the camera is flying around", "markers-moving-camera-planar", "markers on a moving camera"],
  ["whats the best way to remove markers if the camera doesnt move", "markers-locked-off-held-frame", "markers on a static camera"],
  ["i have to get the tracking dots off an actors face", "markers-face-dots", "facial dots"],
  ["how can i paint out tracking crosses stuck on a wall", "markers-walls-floors", "markers on a wall"],
  ["how do i get rid of a wire against the sky", "wire-over-sky", "wire over sky"],
  ["need help removing wires when there are trees behind", "wire-busy-background-offset", "wire over a busy background"],
  ["how do i deal with the wire going over the actors jacket", "wire-across-actor", "wire crossing the performer"],
  ["is there a way to remove a c-stand from the shot", "rig-light-stands-frame-edge", "a stand in shot"],
  ["how do i remove the rig if they didnt shoot a clean plate", "rig-rebuild-background", "no clean plate"],
  ["what do i do about the crash mat at the end of the fall", "rig-crash-mats", "a crash mat"],
  ["how to get rid of the tow bar on a car shot", "rig-tow-bar-car", "tow rig"],
  ["how do i clean dust off a film scan", "dust-busting-film-scans", "film dust"],
  ["i need to fix a scratch that goes down the film", "film-scratch-vertical", "a vertical film scratch"],
  ["how do i get rid of sensor dust", "sensor-dust-fixed-spots", "sensor dust, not film dust"],
  ["what should i do about a hair in the gate", "gate-hair-edge", "gate hair"],
  ["how do i fix stuck pixels", "dead-pixel-repair", "stuck pixels"],
  ["is there a way to get rid of hot pixels in night shots", "hot-pixels-dark-plates", "hot pixels at night"],
  ["how do i take the boom out of the top of frame", "boom-mic-in-frame", "boom in frame"],
  ["how do i remove our shadows from the ground", "crew-shadow-ground", "crew shadows"],
  ["can someone tell me how to lift a shadow off a face", "flag-shadow-on-face", "a shadow on a face"],
  ["how do i get rid of the crew reflection in the car", "reflection-car-bodywork", "crew reflected in a car"],
  ["i need to take the camera out of a reflection in a window", "reflection-window-glass", "camera reflected in a window"],
  ["how to remove the reflection of the camera in someones eyes", "reflection-in-eyes", "camera reflected in eyes"],
  ["how do i get a random guy out of the back of the shot", "crew-people-background", "a person in the background"],
  ["what is the best way to get people walking through a static shot out", "crew-passers-by-locked", "passers-by on a static shot"],
  ["i need to remove footprints in the snow", "footprints-snow-sand", "footprints"],
  ["how do i even out a patchy green screen", "screen-flattening-green", "uneven green screen"],
  ["how do i get rid of the seams in the green screen", "screen-tape-seams", "screen seams"],
  ["the screen is too small how do i fill the rest of the frame", "screen-extension", "screen extension"],
  ["how do i get rid of green spill on the edges", "spill-green-edges", "green spill"],
  ["how do i fix blue spill in hair", "spill-blue-hair", "blue spill in hair"],
  ["how do i put the grain back after painting", "regrain-paint-patches", "regrain after paint"],
  ["should i denoise before i pull a key", "denoise-before-keying", "denoise before key"],
  ["how do i get rid of noise in a night shot", "night-exterior-noise", "night noise"],
  ["how do i make the grain on cg match the plate", "grain-match-cg", "grain matching on CG"],
  ["what do i do about grain that doesnt move on a held frame", "frozen-grain-held-patch", "frozen grain"],
  ["how do i get rid of a logo on someones shirt", "logo-clothing", "logo on clothing"],
  ["i need to change the number plates on the cars", "number-plates-cars", "number plates"],
  ["how do i take a bird out of the sky", "birds-planes-sky", "bird in sky"],
  ["how do i remove rubbish floating in the water", "floating-rubbish-water", "floating rubbish"],
  ["how do i undistort a plate before painting", "undistort-for-paint", "undistort for paint"],
  ["how do i fix the dark corners of the frame", "vignetting-dark-corners", "vignetting"],
  ["how do i get rid of colour fringes on edges", "chromatic-aberration-edges", "colour fringes"],
  ["what can i do about moire on a shirt", "moire-fabric", "moiré on a shirt"],
  ["how do i fix rolling shutter on a fast pan", "rolling-shutter-skew", "rolling shutter on a pan"],
  ["how do i fix a frame where a camera flash only lit half of it", "flash-band-repair", "flash band"],
  ["how do i stop lights from flickering", "deflicker-practical-lights", "light flicker"],
  ["how do i fix flicker in a time lapse", "timelapse-exposure-flicker", "time-lapse flicker"],
  ["i need to remove a tattoo from an arm", "tattoo-cover", "tattoo"],
  ["how do i get rid of a lens flare", "lens-flare-removal", "lens flare"],
  ["how do i stabilise a shaky shot before i paint it", "stabilise-before-paint", "stabilise before paint"],
  ["how do i remove rain streaks in front of the face", "rain-streaks", "rain streaks"],
  ["how do i get rid of the vans in the back of a wide shot", "crew-vehicles-wide", "vans in a wide"],
  ["how do i hide an earpiece", "earpiece-radio-mic", "an earpiece"],
];


/**
 * Second held-out batch (2026-12-03): ten new queries per kind, written from the page titles and
 * summaries only, before looking at the engine's vocabulary or the thesaurus, and never tuned on.
 * All of them count as held out.
 */
const heldOutPlain: Row[] = [
  ["dark corners stitched panorama", "vignetting-stitched-tiles", "corner darkening repeated in the tiles of a panorama"],
  ["contrail removal", "contrails-sky", "aircraft trails across the sky"],
  ["insects at night", "insects-around-lights", "bugs around lamps on night shoots"],
  ["dropped frames", "duplicate-dropped-frames", "missing frames in a damaged sequence"],
  ["earpiece removal", "earpiece-radio-mic", "hiding earpieces on actors"],
  ["fixing things behind smoke", "paint-through-smoke", "paint work through drifting smoke"],
  ["dead leds on video wall", "led-wall-dead-leds", "failed LED modules on a display wall, not sensor pixels"],
  ["seams in green screen", "screen-tape-seams", "joins between screen panels"],
  ["shadow from the crane", "crane-shadow-moving-shot", "a camera crane's shadow, not the boom or crew"],
  ["sunglasses reflection", "reflection-sunglasses-visor", "crew reflected in dark glasses"],
];

const heldOutTypo: Row[] = [
  ["removng posters from wals", "posters-graffiti", "dropped letters in 'removing' and 'walls'"],
  ["flickring tv screen", "monitor-flicker-in-shot", "dropped letter in 'flickering'"],
  ["grian on cg elemnts", "grain-match-cg", "transposed 'grain', dropped letter in 'elements'"],
  ["hareness under costum", "wire-harness-bulges", "extra letter in 'harness', dropped letter in 'costume'"],
  ["lens gohsts", "lens-ghosts", "transposed letters in 'ghosts'"],
  ["chromatic abberation", "chromatic-aberration-edges", "the usual doubled b"],
  ["rolling shuter", "rolling-shutter-skew", "dropped letter in 'shutter'"],
  ["footprnts in sand", "footprints-snow-sand", "dropped letter in 'footprints'"],
  ["numbr plate swap", "number-plates-cars", "dropped letter in 'number'"],
  ["creeses in the screen", "screen-creases-cloth", "misspelt 'creases'"],
];

const heldOutDescribe: Row[] = [
  ["the actors shirt has weird wavy lines all over it", "moire-fabric", "rippling interference on a fabric pattern"],
  ["the lamps in the room keep getting brighter and darker", "deflicker-practical-lights", "practical lamps flickering, not time-lapse exposure"],
  ["purple and green edges around the window frames", "chromatic-aberration-edges", "coloured fringes on high-contrast edges"],
  ["the walls of the building look bent outwards", "straighten-wide-lens-lines", "bowed architecture from a wide lens"],
  ["the whole picture wobbles like jelly from the car mount", "jello-wobble-vibration", "vibration wobble on a car mount"],
  ["moths flying round the street lamp", "insects-around-lights", "insects swarming through a lamp's light"],
  ["you can see the sound guys pole at the top", "boom-mic-in-frame", "the boom dipping into the top of frame"],
  ["tiny coloured dots that stay put in the night shot", "hot-pixels-dark-plates", "hot pixels in a dark plate"],
  ["my patch looks stuck because the grain on it does not move", "frozen-grain-held-patch", "still grain on a held patch"],
  ["half the frame is suddenly bright from someones camera", "flash-band-repair", "a photographer's flash lighting part of the frame"],
];

const heldOutFiller: Row[] = [
  ["how do i remove a tattoo off someones arm", "tattoo-cover", "covering a tattoo"],
  ["whats the best way to fix shiny sweaty foreheads", "sweat-shine-skin", "shine on skin under hot lights"],
  ["how can i get rid of the van parked far away in the wide", "crew-vehicles-wide", "unit vehicles in a wide"],
  ["i need to take out a guy walking through the shot and the camera does not move", "crew-passers-by-locked", "a passer-by in a static shot"],
  ["is there a way to make my patch as blurry as the out of focus background", "defocus-patch-match", "matching the softness of a patch"],
  ["how do i get rid of the camera rails on the floor", "rig-dolly-track", "dolly track in shot"],
  ["what should i do when the rain is hiding the actors face", "rain-streaks", "thinning out rain over faces"],
  ["how do you fix the frames at the end of a film roll that go orange", "light-leak-flash-frames", "roll-end light leaks"],
  ["can someone tell me how to remove cables lying on the set floor", "floor-tape-cables", "cables on the floor of the set"],
  ["how do i put a new sky behind the trees", "sky-replacement-trees", "sky replacement behind foliage"],
];

/**
 * Third held-out batch (issue 16, 2026-12-03): written from the 104 pages' titles and summaries only,
 * before any of the WordNet layer or the generic-word weighting was built, in a junior's own words
 * (everyday words, not the pages' trade words where a junior would not know them). Never tuned to.
 */
const thirdDescribe: Row[] = [
  ["a big orange glow at the start of the shot that fades out", "light-leak-flash-frames", "the first frames of a film roll flashing orange"],
  ["theres a grey smudge in the same spot on every frame from the digital camera", "sensor-dust-fixed-spots", "a soft blob fixed in place from one digital camera is dirt on the sensor"],
  ["a thin white line running top to bottom through the whole old film shot", "film-scratch-vertical", "a line in the same place for many frames is a scratch on the film"],
  ["a little squiggly thing hanging at the side of the picture on the film scan", "gate-hair-edge", "a hair caught in the gate wiggles at the frame edge"],
  ["one tiny dot is stuck red on every frame of a daytime shot", "dead-pixel-repair", "a single pixel stuck in one channel in every frame, not a night-only hot pixel"],
  ["a straight line of wrong pixels going all the way down the picture", "dead-sensor-column", "a whole sensor column reading wrong"],
  ["black squares on the big tv screen behind the presenter", "led-wall-dead-leds", "failed modules of a display wall show as dark squares"],
  ["the shadow of the microphone pole moving about on the wall", "boom-shadow-wall", "the boom's shadow on a set wall"],
  ["our shadows are on the road in front of the car", "crew-shadow-ground", "crew shadows falling across the street"],
  ["a dark stripe across the actress's face from her hat", "flag-shadow-on-face", "a hard shadow of a hat brim over a face"],
  ["a huge shadow swings over the field while the camera flies up", "crane-shadow-moving-shot", "the shadow of the camera crane sweeping the ground during the move"],
  ["you can see the camera guy in the shiny car door", "reflection-car-bodywork", "crew reflected in a picture car's door"],
  ["you can see us in the actors pupils", "reflection-in-eyes", "the camera and crew reflected in eyes"],
  ["the cop's dark glasses show the whole film crew", "reflection-sunglasses-visor", "crew reflected in sunglasses"],
  ["the crew is visible in the puddle on the street", "reflection-water-surface", "people reflected in a puddle"],
  ["when she looks in the bathroom mirror you can see the cameraman", "reflection-mirror-shot", "the operator seen in a mirror shot"],
  ["somebody's arm pokes in at the side of the picture", "crew-member-frame-edge", "part of a crew member sneaking into the frame edge"],
  ["there are lorries parked on the hill far away in the landscape", "crew-vehicles-wide", "production vehicles in the distance of a wide"],
  ["black leads and bits of coloured tape on the studio floor", "floor-tape-cables", "cables and floor marks left on set"],
  ["the snow has tracks in it from people walking about before the take", "footprints-snow-sand", "crew footprints in snow"],
  ["the green backdrop is darker in some places and lighter in others", "screen-flattening-green", "a patchy green screen to even out"],
  ["the blue backing gets murky towards the corners", "screen-blue-falloff", "a blue screen darkening toward the frame corners"],
  ["you can see the joins between the pieces of green cloth", "screen-tape-seams", "seams where screen lengths are taped together"],
  ["the green sheet stops before the edge of the picture", "screen-extension", "a backing too small to fill frame"],
  ["the actor's arms look greenish because of the screen", "spill-bounce-on-skin", "green bounce light on skin"],
  ["blue fringe around her curly hair", "spill-blue-hair", "blue contamination in fine hair"],
  ["the edges of my key are buzzing and crawling", "denoise-before-keying", "chattering key edges from noise: key on a denoised copy"],
  ["the dark areas of the night shot are full of fizzy speckles", "night-exterior-noise", "heavy sensor noise in a dark night plate"],
  ["the cg robot looks too clean next to the filmed footage", "grain-match-cg", "a CG element without the plate's grain"],
  ["the picture breaks up into little squares", "compression-macroblocking", "compression blocks"],
  ["the sky has stripes of colour instead of a smooth fade", "banding-gradients", "banding in a smooth gradient"],
  ["a famous brand on the runner's cap", "logo-clothing", "a brand mark on clothing that moves with the body"],
  ["a real shop name above the door that we have no permission for", "shop-signs-replacement", "a real shop sign needing clearance"],
  ["plastic bags and bottles bobbing in the canal", "floating-rubbish-water", "litter floating on water"],
  ["white lines from jets across the sky in a film set long ago", "contrails-sky", "aircraft trails that break a period setting"],
  ["the corners of the shot are darker than the middle", "vignetting-dark-corners", "vignetting"],
  ["each photo in the panorama has dark corners so the joins show", "vignetting-stitched-tiles", "vignetting repeating in stitched tiles"],
  ["the telegraph poles lean over when the camera whips sideways", "rolling-shutter-skew", "verticals leaning on a fast pan: rolling shutter skew"],
  ["the handheld shot shakes too much to paint on", "stabilise-before-paint", "stabilise first, paint, put the shake back"],
  ["some frames are missing and others repeat so the motion jumps", "duplicate-dropped-frames", "dropped and duplicated frames"],
  ["a pimple on the actor's chin", "beauty-blemishes", "a spot on the skin"],
  ["the little plastic thing in the actor's ear", "earpiece-radio-mic", "an earpiece on an actor"],
  ["my fix on the sea wobbles wrong when the waves move", "patching-moving-water", "a paint fix on moving water"],
  ["my patch is too sharp next to the blurry bit behind it", "defocus-patch-match", "matching a patch's focus to the out-of-focus area"],
  ["there is fog everywhere and i need to remove a sign behind it", "paint-through-smoke", "paint work through haze without losing it"],
  ["the candle light on my patch stays still while the room flickers", "firelight-flicker-on-patch", "a patch must flicker along with firelight"],
  ["the sky timelapse keeps jumping brighter and darker", "timelapse-exposure-flicker", "exposure flicker in a time-lapse"],
  ["black bars rolling up the old tv in the room", "monitor-flicker-in-shot", "rolling bars on a television filmed on set"],
  ["the actor's striped tie shimmers", "moire-fabric", "moiré on a fine fabric pattern"],
  ["wavy rainbow patterns on the computer monitor we filmed", "moire-monitors-led", "moiré when filming a display"],
  ["a row of coloured circles across the picture when the sun is in shot", "lens-ghosts", "ghost rings from a bright source inside the lens"],
  ["a streaky glare from the car headlights pointing at the camera", "lens-flare-removal", "a flare from lights pointing into the lens"],
  ["the walls bend near the edges and my patches will not line up", "undistort-for-paint", "lens distortion to remove before paint so patches line up"],
  ["raindrops on the camera glass", "lens-dirt-water-drops", "water drops on the front of the lens"],
  ["little bits floating in the sunbeam", "floating-dust-in-light", "particles drifting in a light beam"],
  ["white specks on some frames of the old film", "dust-busting-film-scans", "dirt on one frame of a film scan"],
  ["tiny bright coloured dots in the long exposure shot", "hot-pixels-dark-plates", "hot pixels in long exposures"],
  ["the stunt guy's vest makes lumps under his shirt", "wire-harness-bulges", "a harness showing through clothing"],
  ["the metal bar pulling the car is visible", "rig-tow-bar-car", "a tow bar on a car shot"],
  ["big soft blocks where the stuntman lands", "rig-crash-mats", "crash mats"],
  ["sticks holding up the creature's arms", "rig-puppet-rods", "rods moving a puppet creature"],
  ["the feet of a lamp and sandbags peeking in at the side", "rig-light-stands-frame-edge", "lighting stand legs and sandbags at the frame edge"],
  ["rails on the ground that the camera rolls along", "rig-dolly-track", "dolly track in shot"],
  ["the stunt line is smeared into a blurry streak", "wire-motion-blurred", "a motion-blurred wire"],
  ["a thin line through her loose hair", "wire-through-hair", "a fine wire through hair"],
  ["a string going across the hero's jacket", "wire-across-actor", "a wire in front of the performer's costume"],
  ["orange cones on the beach for tracking", "markers-location-ground", "tracking cones on sand"],
  ["white dots stuck on the performer's cheeks", "markers-face-dots", "facial tracking dots"],
];

const thirdTypo: Row[] = [
  ["sesnor dust spots", "sensor-dust-fixed-spots", "transposed letters in 'sensor'"],
  ["vignetting dark corenrs", "vignetting-dark-corners", "transposed letters in 'corners'"],
  ["moire on a stipey shirt", "moire-fabric", "dropped letter in 'stripey'"],
  ["refelctions in sunglases", "reflection-sunglasses-visor", "transposed 'reflections', dropped letter in 'sunglasses'"],
  ["shaddow of the boom on the wal", "boom-shadow-wall", "doubled letter in 'shadow', dropped letter in 'wall'"],
  ["dolly trak in shot", "rig-dolly-track", "dropped letter in 'track'"],
  ["contrials in the sky", "contrails-sky", "transposed letters in 'contrails'"],
  ["square compresion blocks in the footage", "compression-macroblocking", "dropped letter in 'compression'"],
  ["bandng in the sky gradient", "banding-gradients", "dropped letter in 'banding'"],
  ["tatoo removal", "tattoo-cover", "dropped letter in 'tattoo'"],
  ["hide the earpeice", "earpiece-radio-mic", "i before e in 'earpiece'"],
  ["timelaps flicker", "timelapse-exposure-flicker", "dropped letter in 'timelapse'"],
  ["light leeks at roll end", "light-leak-flash-frames", "'leaks' spelt as the vegetable"],
  ["stuck pixle on every frame", "dead-pixel-repair", "transposed letters in 'pixel'"],
  ["blue spil on her hair", "spill-blue-hair", "dropped letter in 'spill'"],
  ["stabalise handheld shot", "stabilise-before-paint", "wrong vowel in 'stabilise'"],
  ["crash matts", "rig-crash-mats", "doubled letter in 'mats'"],
  ["puddel reflections", "reflection-water-surface", "transposed letters in 'puddle'"],
  ["tow barr on car", "rig-tow-bar-car", "doubled letter in 'bar'"],
  ["lens flair from lights", "lens-flare-removal", "'flare' spelt as a real but wrong word"],
  ["skewed verticles rolling shuter", "rolling-shutter-skew", "misspelt 'verticals' and 'shutter'"],
  ["firelite flicker on patch", "firelight-flicker-on-patch", "phonetic spelling of 'firelight'"],
];

/**
 * A development batch of describe-what-you-see queries (2026-12-03), written like the third batch
 * from titles and summaries only, but TUNED on openly: its misses were read to find general
 * mechanisms (the held-out batches stay unread).
 */
const devDescribe: Row[] = [
  ["there is a microphone on a stick poking in at the top", "boom-mic-in-frame", "the boom dipping into frame"],
  ["the shot is wobbly like it was filmed from a moving car", "jello-wobble-vibration", "vibration wobble from a car mount"],
  ["dirty marks from the old film reel that jump about", "dust-busting-film-scans", "dirt that sits on one frame only"],
  ["grey smears on the lens after it rained", "lens-dirt-water-drops", "water and dirt on the lens"],
  ["bright white circles of light across the image from the sun", "lens-ghosts", "ghost shapes from a bright source"],
  ["my painted fix looks plastic because the rest of the shot is noisy", "regrain-paint-patches", "patches need the plate's grain back"],
  ["the red letters on the shop window are a real brand", "shop-signs-replacement", "a real shop name needing clearance"],
  ["the number on the back of the car is real", "number-plates-cars", "a real registration plate"],
  ["somebody's phone shows a real app we cannot use", "phone-laptop-screens", "content on a device in shot"],
  ["a bird flies right across the clean sky", "birds-planes-sky", "a bird through clear sky"],
  ["seagulls bobbing on the harbour with crisp packets", "floating-rubbish-water", "litter floating in a harbour"],
  ["the pictures on the monitor roll and flash", "monitor-flicker-in-shot", "rolling bars on a screen in shot"],
  ["candle flames make the faces go brighter and darker", "firelight-flicker-on-patch", "firelight flicker"],
  ["the lamp in the kitchen pulses all the time", "deflicker-practical-lights", "a practical light pulsing on mains power"],
  ["two frames look the same and then one is missing", "duplicate-dropped-frames", "duplicated and dropped frames"],
  ["spots and scabs on the actress's face", "beauty-blemishes", "blemishes on skin"],
  ["the character has an ink drawing on his neck that must go", "tattoo-cover", "a tattoo to remove"],
  ["a wire goes into the actor's ear", "earpiece-radio-mic", "an earpiece and its cable"],
  ["the new sky looks cut out around the leaves", "sky-replacement-trees", "sky replacement behind foliage"],
  ["hard to fix things behind the smoke machine haze", "paint-through-smoke", "paint through smoke"],
  ["water from the sprinklers covers the actress's face", "rain-streaks", "rain from a rain machine hiding faces"],
  ["the puppeteer's poles holding up the dragon", "rig-puppet-rods", "rods that move a creature"],
  ["the big metal crane arm is in the shot and we have a plate without it", "rig-clean-plate", "a rig with a clean pass"],
  ["the rig never leaves the shot so there is no empty plate", "rig-rebuild-background", "rebuilding the background without a clean pass"],
  ["the stuntman is hanging from a wire in front of the blue sky", "wire-over-sky", "a wire over clear sky"],
  ["the wire keeps crossing the busy brick wall behind", "wire-busy-background-offset", "wire over a busy background"],
  ["the flying line is in front of clouds that move", "wire-against-moving-clouds", "a wire in front of moving clouds"],
  ["white crosses on the green wall behind the actor", "markers-green-matrix", "tracking markers on a green screen"],
  ["the stickers on the blue sheet need to go", "markers-blue-matrix", "markers on a blue screen"],
  ["sticky dots stuck to the wall and floor of the set", "markers-walls-floors", "markers on real set surfaces"],
];

const toQueries = (kind: QueryKind, rows: Row[]): QualityQuery[] => rows.map(([query, expected, reason]) => ({ kind, query, expected, reason }));

const FIRST_SET: QualityQuery[] = [...toQueries("plain", plain), ...toQueries("typo", typo), ...toQueries("describe", describe), ...toQueries("filler", filler)];
const SECOND_HELD_OUT: QualityQuery[] = [
  ...toQueries("plain", heldOutPlain),
  ...toQueries("typo", heldOutTypo),
  ...toQueries("describe", heldOutDescribe),
  ...toQueries("filler", heldOutFiller),
];

const THIRD_HELD_OUT: QualityQuery[] = [...toQueries("typo", thirdTypo), ...toQueries("describe", thirdDescribe)];

const DEV_SET: QualityQuery[] = toQueries("describe", devDescribe);

export const QUALITY_QUERIES: QualityQuery[] = [...FIRST_SET, ...SECOND_HELD_OUT, ...THIRD_HELD_OUT, ...DEV_SET];

/**
 * Held out of tuning: every fourth query of each kind in the first set (positions 3, 7, 11, …
 * within the kind), and every query of the second and third batches.
 */
export function isHeldOut(q: QualityQuery): boolean {
  if (SECOND_HELD_OUT.includes(q) || THIRD_HELD_OUT.includes(q)) return true;
  const sameKind = FIRST_SET.filter((x) => x.kind === q.kind);
  return sameKind.indexOf(q) % 4 === 3;
}

export const QUERY_KINDS: readonly QueryKind[] = ["plain", "typo", "describe", "filler"];

/** The development batch: tuned on openly (its misses are listed), reported apart with `--batches`. */
export function isDevBatch(q: QualityQuery): boolean {
  return DEV_SET.includes(q);
}

/** Which held-out batch a query belongs to (for reporting generalisation apart), or null when tuned. */
export function heldOutBatch(q: QualityQuery): "first-quarter" | "second" | "third" | null {
  if (SECOND_HELD_OUT.includes(q)) return "second";
  if (THIRD_HELD_OUT.includes(q)) return "third";
  return isHeldOut(q) ? "first-quarter" : null;
}
