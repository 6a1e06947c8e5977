/** TanStack Query keys of the shot log, shared by the forms that change it and the tables that show it. */
export const TECHNIQUE_USES = "technique-uses";
export const techniqueUsesKey = (slug: string) => [TECHNIQUE_USES, slug] as const;
