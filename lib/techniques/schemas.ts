import { z } from "zod";
import { techniqueDocumentSchema, type TechniqueDocument } from "@/lib/techniques/document";
import { recipeSchema, type RecipeStep } from "@/lib/lab/recipe";

export const TECHNIQUE_STATUSES = ["draft", "in_review", "approved", "retired"] as const;
export type TechniqueStatus = (typeof TECHNIQUE_STATUSES)[number];
export const STATUS_LABELS: Record<TechniqueStatus, string> = {
  draft: "Draft",
  in_review: "Waiting for review",
  approved: "Approved",
  retired: "Retired",
};

export const slugSchema = z
  .string()
  .trim()
  .min(1)
  .max(120)
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, "Not a valid slug.");

const techniqueFields = {
  title: z.string().trim().min(3, "Give the technique a title of at least 3 characters.").max(140),
  summary: z.string().trim().min(1, "Write a one-line summary.").max(280, "Keep the summary to one line (280 characters)."),
  aliases: z.array(z.string().trim().min(1).max(80)).max(20).default([]),
  /** Tag slugs, problem and plate alike. */
  tags: z.array(slugSchema).max(20).default([]),
  body: techniqueDocumentSchema.optional(),
  recipe: recipeSchema.default([]),
};

export const createTechniqueSchema = z.object({
  ...techniqueFields,
  /** A technique request this write-up answers. */
  requestId: z.string().uuid().optional(),
});
export type CreateTechniqueInput = z.infer<typeof createTechniqueSchema>;

export const updateTechniqueSchema = z.object({
  ...techniqueFields,
  baseRevision: z.number().int().min(1),
  changeNote: z.string().trim().min(1, "Say what changed and why.").max(500),
});
export type UpdateTechniqueInput = z.infer<typeof updateTechniqueSchema>;

export const reviewSchema = z
  .object({
    revision: z.number().int().min(1),
    decision: z.enum(["approve", "return"]),
    note: z.string().trim().max(2000).optional(),
  })
  .refine((v) => v.decision === "approve" || (v.note && v.note.length > 0), {
    message: "Tell the author what to change.",
    path: ["note"],
  });
export type ReviewInput = z.infer<typeof reviewSchema>;

export const retireSchema = z.object({
  supersededBy: slugSchema.optional(),
  note: z.string().trim().max(2000).optional(),
});
export type RetireInput = z.infer<typeof retireSchema>;

export const listTechniquesQuerySchema = z.object({
  status: z.enum(TECHNIQUE_STATUSES).optional(),
  tag: slugSchema.optional(),
  mine: z.enum(["1", "true"]).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
});

export const diffQuerySchema = z.object({ from: z.coerce.number().int().min(1), to: z.coerce.number().int().min(1) });

export type TagRef = { slug: string; name: string; kind: "problem" | "plate" };
export type PersonRef = { id: string; name: string } | null;

export type TechniqueListItem = {
  slug: string;
  title: string;
  summary: string;
  status: TechniqueStatus;
  tags: TagRef[];
  updatedAt: string;
  hasPendingRevision: boolean;
  isHouseMethodFor: string[];
};
export type TechniqueListResponse = { items: TechniqueListItem[]; total: number };

export type RevisionSummary = {
  number: number;
  state: "draft" | "in_review" | "approved" | "returned";
  changeNote: string;
  author: PersonRef;
  createdAt: string;
  reviewedBy: PersonRef;
  reviewedAt: string | null;
  reviewNote: string | null;
};

export type TechniqueResponse = {
  id: string;
  slug: string;
  title: string;
  summary: string;
  aliases: string[];
  status: TechniqueStatus;
  tags: TagRef[];
  body: TechniqueDocument;
  recipe: RecipeStep[];
  /** The revision shown: the approved one for readers, the newest for writers. */
  revision: RevisionSummary;
  latestRevision: number;
  approvedRevision: number | null;
  hasPendingRevision: boolean;
  createdBy: PersonRef;
  approvedBy: PersonRef;
  lastApprovedAt: string | null;
  supersededBy: { slug: string; title: string } | null;
  retiredAt: string | null;
  retireNote: string | null;
  isHouseMethodFor: TagRef[];
};
