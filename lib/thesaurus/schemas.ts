import { z } from "zod";
import { quotedTerm } from "@/lib/search/thesaurus";

/**
 * The trade thesaurus as the API and the thesaurus page see it. Client-safe. Terms are lower-case
 * words or short phrases; a synonym group needs two or more, a narrower entry names its broader term.
 * A term written in double quotes ("backing", quotes included) is met only by its words as written or
 * their plurals (lib/search/thesaurus.ts).
 */
const termText = z
  .string()
  .trim()
  .toLowerCase()
  .min(2, "A term has at least two characters.")
  .max(60, "Keep a term under 60 characters.")
  .regex(/[a-z0-9]/, "A term needs a letter or a digit.")
  .transform((t) => t.replace(/\s+/g, " "));
const term = termText.superRefine((t, ctx) => {
  // termText already asks for a letter or digit; a well-formed quoted term has it inside the quotes.
  if (t.includes('"') && quotedTerm(t) === null) {
    ctx.addIssue({ code: "custom", message: `“${t}”: quotes go around a whole term ("backing") to match only its exact words; a term has no other quotes.` });
  }
});
/** What the broader term of a narrower entry finds: pages, by word family, so quotes would mean nothing. */
const broaderTerm = termText.refine((t) => !t.includes('"'), { message: "The broader term takes no quotes: quotes only limit which typed words meet a term." });

const note = z.string().trim().max(300, "Keep the note under 300 characters.").default("");
const terms = z.array(term).max(30, "At most 30 terms in one entry.");

/** A term without its quotes: "backing" and backing are the same term. */
const unquoted = (t: string): string => quotedTerm(t) ?? t;

function noRepeats(values: readonly string[], ctx: z.RefinementCtx): void {
  const seen = new Set<string>();
  for (const v of values) {
    if (seen.has(unquoted(v))) ctx.addIssue({ code: "custom", path: ["terms"], message: `“${unquoted(v)}” is listed twice.` });
    seen.add(unquoted(v));
  }
}

export const thesaurusEntryInputSchema = z
  .discriminatedUnion("kind", [
    z.object({ kind: z.literal("synonyms"), terms: terms.min(2, "A synonym group needs at least two terms."), note }),
    z.object({ kind: z.literal("narrower"), broader: broaderTerm, terms: terms.min(1, "Name at least one narrower term."), note }),
  ])
  .superRefine((entry, ctx) => {
    noRepeats(entry.terms, ctx);
    if (entry.kind === "narrower" && entry.terms.map(unquoted).includes(entry.broader)) {
      ctx.addIssue({ code: "custom", path: ["broader"], message: "The broader term cannot also be one of its narrower terms." });
    }
  });
export type ThesaurusEntryInput = z.infer<typeof thesaurusEntryInputSchema>;

export type ThesaurusEntryDto = {
  id: string;
  kind: "synonyms" | "narrower";
  /** Narrower entries only. */
  broader: string | null;
  terms: string[];
  note: string;
  updatedAt: string;
  updatedBy: string | null;
};

export type ThesaurusListResponse = { items: ThesaurusEntryDto[] };
