import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { createThesaurusEntry } from "@/lib/thesaurus/mutations";
import { listThesaurusEntries } from "@/lib/thesaurus/queries";
import { thesaurusEntryInputSchema, type ThesaurusEntryDto, type ThesaurusListResponse } from "@/lib/thesaurus/schemas";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  return Response.json({ items: await listThesaurusEntries(user) } satisfies ThesaurusListResponse);
});

/** Leads only. */
export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  const input = await parseJson(req, thesaurusEntryInputSchema);
  return Response.json((await createThesaurusEntry(user, input)) satisfies ThesaurusEntryDto, { status: 201 });
});
