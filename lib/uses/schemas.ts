import { z } from "zod";
import { showCodeSchema } from "@/lib/shows/schemas";
import { shotCodeSchema } from "@/lib/shots/schemas";

/* Use logs (a technique used on a shot): validation and answers shared by the server and the browser. */

export const USE_OUTCOMES = ["clean", "touch-up", "failed"] as const;
export type UseOutcome = (typeof USE_OUTCOMES)[number];

export const USE_OUTCOME_LABELS: Record<UseOutcome, string> = {
  clean: "Clean",
  "touch-up": "Needed touch-up",
  failed: "Failed",
};

const stillRef = z.string().uuid("Not a valid still id.").nullish();

/** Body of POST /api/techniques/{slug}/uses (shared/API.md). */
export const logUseSchema = z.object({
  shot: shotCodeSchema,
  outcome: z.enum(USE_OUTCOMES, { message: `Outcome must be one of: ${USE_OUTCOMES.join(", ")}.` }),
  note: z.string().trim().max(4000, "The note is too long.").default(""),
  beforeStill: stillRef,
  afterStill: stillRef,
});
export type LogUseInput = z.infer<typeof logUseSchema>;

/** PATCH /api/uses/{id}: any subset; a still set to null is detached. */
export const updateUseSchema = z
  .object({
    shot: shotCodeSchema.optional(),
    outcome: logUseSchema.shape.outcome.optional(),
    note: z.string().trim().max(4000, "The note is too long.").optional(),
    beforeStill: stillRef,
    afterStill: stillRef,
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), { message: "Nothing to change." });
export type UpdateUseInput = z.infer<typeof updateUseSchema>;

const USE_SORTS = ["createdAt", "shot", "outcome", "user"] as const;
export const listUsesQuerySchema = z.object({
  sort: z.enum(USE_SORTS).default("createdAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  outcome: z.enum(USE_OUTCOMES).optional(),
  show: showCodeSchema.optional(),
  /** Part of a shot code or note. */
  q: z.string().trim().max(100).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(25),
  offset: z.coerce.number().int().min(0).default(0),
});
export type ListUsesQuery = z.infer<typeof listUsesQuerySchema>;

// ---- Response DTOs (shared by route handlers and client hooks) ----

export type PersonRef = { id: string; name: string };
export type TechniqueRef = { id: string; slug: string; title: string; status: "draft" | "in_review" | "approved" | "retired" };

/** Shown on a shot that used a retired technique: "retired — see {replacement}". */
export type FollowUp = { note: string; replacement: { slug: string; title: string } | null };

export type ShotUseResponse = {
  id: string;
  technique: TechniqueRef;
  outcome: UseOutcome;
  note: string;
  user: PersonRef | null;
  beforeStill: string | null;
  afterStill: string | null;
  /** Alt text of the stills, for their thumbnails; a still the reader may not open is left out (id and alt null). */
  beforeStillAlt: string | null;
  afterStillAlt: string | null;
  revisionId: string | null;
  followUp: FollowUp | null;
  canEdit: boolean;
  createdAt: string;
  updatedAt: string;
};
export type UseResponse = {
  id: string;
  technique: TechniqueRef;
  shot: { code: string; showCode: string; sequence: string };
  outcome: UseOutcome;
  note: string;
  user: PersonRef | null;
  beforeStill: string | null;
  afterStill: string | null;
  revisionId: string | null;
  canEdit: boolean;
  createdAt: string;
  updatedAt: string;
};
export type OutcomeCounts = Record<UseOutcome, number> & { total: number };
export type TechniqueUsesResponse = { items: UseResponse[]; total: number; counts: OutcomeCounts };

export type FollowUpShot = {
  code: string;
  showCode: string;
  uses: number;
  lastOutcome: UseOutcome;
  lastUsedAt: string;
};
