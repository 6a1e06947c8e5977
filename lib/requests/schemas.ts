import { z } from "zod";

export const requestSchema = z.object({
  query: z.string().trim().min(2, "Describe the problem in a few words.").max(200),
  note: z.string().trim().max(2000).default(""),
});
export type RequestInput = z.infer<typeof requestSchema>;

export type TechniqueRequestResponse = {
  id: string;
  query: string;
  note: string;
  status: "open" | "claimed" | "resolved";
  requester: { id: string; name: string } | null;
  claimedBy: { id: string; name: string } | null;
  createdAt: string;
};
