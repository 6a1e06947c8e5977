import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { deleteThesaurusEntry, updateThesaurusEntry } from "@/lib/thesaurus/mutations";
import { getThesaurusEntry } from "@/lib/thesaurus/queries";
import { thesaurusEntryInputSchema, type ThesaurusEntryDto } from "@/lib/thesaurus/schemas";

type Params = { id: string };

export const GET = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  return Response.json((await getThesaurusEntry(user, (await ctx.params).id)) satisfies ThesaurusEntryDto);
});

/** Leads only: replaces the entry's kind, terms and note. */
export const PUT = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  const input = await parseJson(req, thesaurusEntryInputSchema);
  return Response.json((await updateThesaurusEntry(user, (await ctx.params).id, input)) satisfies ThesaurusEntryDto);
});

export const DELETE = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  await deleteThesaurusEntry(user, (await ctx.params).id);
  return new Response(null, { status: 204 });
});
