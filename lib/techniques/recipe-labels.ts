/** Plain words for each recipe operation, for cards on the page and for search. */
export const RECIPE_PARAMETER_LABELS: Record<string, string> = {
  matrix: "colour matrix",
  copy: "channel copy",
  level: "level match",
  matte: "matte from channel",
  grow: "grow or shrink matte",
  soften: "soften",
  mix: "mix through matte",
  flatten: "flatten screen",
  grain: "restore grain",
};
