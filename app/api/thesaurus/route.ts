import { authedRoute, otherMethods } from "@/lib/api/handler";
import { createThesaurusEntry } from "@/lib/thesaurus/mutations";
import { listThesaurusEntries } from "@/lib/thesaurus/queries";
import { thesaurusEntryInputSchema, type ThesaurusEntryDto, type ThesaurusListResponse } from "@/lib/thesaurus/schemas";

export const GET = authedRoute(async (req, { user }) => {
  return Response.json({ items: await listThesaurusEntries(user) } satisfies ThesaurusListResponse);
});

/** Leads only. */
export const POST = authedRoute("thesaurus:manage", async (req, { user, json }) => {
  const input = await json(thesaurusEntryInputSchema);
  return Response.json((await createThesaurusEntry(user, input)) satisfies ThesaurusEntryDto, { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
