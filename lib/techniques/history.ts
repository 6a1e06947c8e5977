import "server-only";
import type { Revision } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/roles";
import { listPairsOfRevision } from "@/lib/stills/queries";
import { diffPairs, diffRevisions, STILL_TOKEN_BASE, type DiffStill, type FieldDiff, type PairChange, type RevisionSnapshot } from "@/lib/techniques/diff";
import { documentToPlainText } from "@/lib/techniques/plain-text";
import { loadTagMap } from "@/lib/tags/queries";
import { getRevisionsByNumber } from "@/lib/techniques/queries";

/** `from` 0 compares with nothing (a new technique's first review). */
type RevisionDiffResponse = { slug: string; from: number; to: number; fields: FieldDiff[]; pairs: PairChange[] };

/** Field-by-field word diff of two revisions the person may see, with body stills as thumbnails and pair changes. */
export async function revisionDiff(user: SessionUser, slug: string, from: number, to: number): Promise<RevisionDiffResponse> {
  const [a, b] = from === 0 ? [null, ...(await getRevisionsByNumber(user, slug, [to]))] : await getRevisionsByNumber(user, slug, [from, to]);
  return { slug, from, to, ...(await diffOf(a ?? null, b!)) };
}

async function diffOf(a: Revision | null, b: Revision): Promise<{ fields: FieldDiff[]; pairs: PairChange[] }> {
  const tagMap = await loadTagMap();
  // One private-use character per still, shared by both sides, so the word diff sees each still as one token.
  const stills: Record<string, DiffStill> = {};
  const tokens = new Map<string, string>();
  const still = ({ stillId, alt, caption }: { stillId: string; alt: string; caption: string }) => {
    let token = tokens.get(stillId);
    if (!token) {
      token = String.fromCodePoint(STILL_TOKEN_BASE + tokens.size);
      tokens.set(stillId, token);
      stills[token] = { id: stillId, alt };
    }
    return caption ? `${token} ${caption}` : token;
  };
  const snapshot = (r: Revision | null): RevisionSnapshot =>
    r
      ? {
          title: r.title,
          summary: r.summary,
          aliases: r.aliases,
          tags: r.tagIds.map((id) => tagMap.get(id)?.name ?? "(removed tag)"),
          bodyText: documentToPlainText(r.body, { still }),
          recipe: r.recipe,
        }
      : { title: "", summary: "", aliases: [], tags: [], bodyText: "", recipe: [] };
  const fields = diffRevisions(snapshot(a), snapshot(b)).map((f) => (f.field === "bodyText" && tokens.size ? { ...f, stills } : f));
  const pairsOf = async (r: Revision | null) =>
    (r ? await listPairsOfRevision(r.id) : []).map((p) => ({
      before: { id: p.beforeRow.id, alt: p.beforeRow.alt },
      after: { id: p.afterRow.id, alt: p.afterRow.alt },
      caption: p.caption,
    }));
  return { fields, pairs: diffPairs(await pairsOf(a), await pairsOf(b)) };
}
