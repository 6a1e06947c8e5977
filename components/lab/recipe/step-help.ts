import type { RecipeOp } from "@/lib/lab/recipe";

/*
 * What each step computes, in the words the lab shows beside the step (and README's "Still lab"
 * section repeats). Keep in step with lib/lab/engine.ts, lib/lab/gaussian.ts and kernels.ts:
 * the definitions below are what the engine does, borders and special cases included.
 */
export const STEP_HELP: Record<RecipeOp, string> = {
  matrix:
    "Each output channel is a weighted sum of the input R, G and B plus an offset (out = M · rgb + offset; the first row makes red). " +
    "Nothing is clipped between steps. A result beyond the float range (about 3.4 × 10³⁸) stops the run with an error naming this step.",
  copy: "Replaces one channel with another, pixel by pixel.",
  level:
    "Fits a gain (and, if chosen, an offset) by least squares so this channel matches a channel of the plate the recipe cleans, " +
    "over the rectangle (the whole frame if none), then applies it to every pixel. When the recipe restores grain, that plate is " +
    "the denoised still: the fit is made against it, not against the grainy original.",
  matte:
    "Makes the matte from one channel, or a weighted sum of R, G and B, of the working image or of the plate (the denoised still when " +
    "the recipe restores grain): at or below black → 0, at or above white → 1, a straight ramp between. If black equals white it is a " +
    "hard step: values at or above white are 1, the rest 0. The matte is kept in double precision.",
  grow:
    "Grows (positive) or shrinks (negative) the matte: each pixel takes the largest (or smallest) matte value in the square of side " +
    "2N + 1 around it. At the frame edge the square is cut off: only pixels inside the frame count, so the edge itself neither grows " +
    "nor shrinks the matte. Previews scale N with the image.",
  soften:
    "Gaussian blur of the matte or of one channel: weights exp(−t² / 2σ²) at whole-pixel offsets t up to R = round(4σ), divided by " +
    "their sum, applied along rows and then along columns. Beyond the frame edge the edge pixel repeats. “Render exact” computes " +
    "this kernel exactly at every sigma up to 200; quick previews use a faster approximation.",
  mix:
    "Result = working image × matte + plate × (1 − matte); inverted, the other way round. When the recipe restores grain, the " +
    "plate here is the denoised still, so the grain step after it gives back the original plate exactly where the matte is 0.",
  flatten:
    "Evens out an uneven screen: each pixel is divided by an estimate of the screen around it and multiplied by the target colour. " +
    "The estimate averages clean screen with the soften step's Gaussian at this sigma (normalized convolution): screen weight " +
    "1 − matte outside the matte, the matte inside, 1 everywhere. Where less than 1 % of the kernel's weight lies on clean screen, " +
    "the estimate is topped up with the whole frame's mean screen colour (deep in a large hole it is that mean); the render " +
    "reports how many pixels that was. A channel whose estimate is not above 0 is left as it is.",
  grain:
    "Puts the plate's grain back: result + (plate − denoised still). The steps before it run on the denoised still, and every " +
    "“plate” they read (level's reference, a matte from the plate, mix) is that denoised still.",
};
