import type { SearchDocument } from "@/lib/search/types";

/** An approved page for the engine's tests: the title names it (id and slug), the rest empty unless given. */
export function searchDoc(p: Partial<SearchDocument> & { title: string }): SearchDocument {
  return {
    techniqueId: p.title,
    slug: p.title.toLowerCase().replace(/\W+/g, "-"),
    summary: "",
    aliases: [],
    tags: [],
    parameterNames: [],
    shotCodes: [],
    bodyText: "",
    status: "approved",
    houseMethodFor: [],
    updatedAt: "2026-01-01T00:00:00.000Z",
    ...p,
  };
}
