import { authedRoute, otherMethods } from "@/lib/api/handler";
import { deleteThesaurusEntry, updateThesaurusEntry } from "@/lib/thesaurus/mutations";
import { getThesaurusEntry } from "@/lib/thesaurus/queries";
import { thesaurusEntryInputSchema, type ThesaurusEntryDto } from "@/lib/thesaurus/schemas";

type Params = { id: string };

export const GET = authedRoute<Params>(async (req, { user, params }) => {
  return Response.json((await getThesaurusEntry(user, params.id)) satisfies ThesaurusEntryDto);
});

/** Leads only: replaces the entry's kind, terms and note. */
export const PUT = authedRoute<Params>("thesaurus:manage", async (req, { user, params, json }) => {
  const input = await json(thesaurusEntryInputSchema);
  return Response.json((await updateThesaurusEntry(user, params.id, input)) satisfies ThesaurusEntryDto);
});

export const DELETE = authedRoute<Params>("thesaurus:manage", async (req, { user, params }) => {
  await deleteThesaurusEntry(user, params.id);
  return new Response(null, { status: 204 });
});

export const { HEAD, OPTIONS, POST, PATCH } = otherMethods({ GET, PUT, DELETE });
