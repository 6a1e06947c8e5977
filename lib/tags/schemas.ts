import { z } from "zod";
import { slugSchema } from "@/lib/techniques/schemas";

export const tagInputSchema = z.object({
  kind: z.enum(["problem", "plate"]),
  name: z.string().trim().min(2, "Name the tag.").max(60),
  description: z.string().trim().max(500).default(""),
  aliases: z.array(z.string().trim().min(1).max(60)).max(20).default([]),
});
export type TagInput = z.infer<typeof tagInputSchema>;

export const tagUpdateSchema = tagInputSchema.omit({ kind: true }).partial();
export type TagUpdateInput = z.infer<typeof tagUpdateSchema>;

export const tagMergeSchema = z.object({ into: slugSchema });
