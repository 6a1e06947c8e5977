import "server-only";
import fs from "node:fs/promises";
import crypto from "node:crypto";
import { inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import { DEMO_TECHNIQUES, type DemoTechnique } from "@/scripts/seed/data/techniques";
import type { SessionUser } from "@/lib/auth/roles";
import { runRecipe } from "@/lib/lab/engine";
import { recipeSchema, type RecipeStep } from "@/lib/lab/recipe";
import { demoCleanupRecipe, generateSyntheticPlate } from "@/lib/lab/synthetic";
import { logUse } from "@/lib/uses/mutations";
import { createPair, createStill } from "@/lib/stills/mutations";
import { newIncomingPath } from "@/lib/stills/storage";
import { createTechnique, retireTechnique, reviewTechnique, setHouseMethod, submitTechnique, updateTechnique } from "@/lib/techniques/mutations";
import { findTechniqueBySlug, getTechnique } from "@/lib/techniques/queries";
import { answerQuestion, askQuestion } from "@/lib/questions/mutations";
import { createRequest } from "@/lib/requests/mutations";
import { subscribe } from "@/lib/subscriptions/mutations";
import { documentFromText } from "@/lib/techniques/document";
import { slugify } from "@/lib/techniques/slug";
import type { TechniqueDocument } from "@/lib/techniques/document";

/** Techniques that get generated stills and a runnable recipe, with the screen colour of their plate. */
const WITH_STILLS: Record<string, { screen: "green" | "blue"; seed: number }> = {
  "marker-channel-cleanup": { screen: "green", seed: 7 },
};
const STILL_WIDTH = 1280;
const STILL_HEIGHT = 720;

async function storeStill(actor: SessionUser, bytes: Buffer, fields: { technique: string; alt: string; caption: string; role: "before" | "after" | "reference" }) {
  const path = await newIncomingPath();
  await fs.writeFile(path, bytes);
  const sha256 = crypto.createHash("sha256").update(bytes).digest("hex");
  return createStill(actor, { file: { path, sha256, size: bytes.length, originalName: `${fields.role}.png` }, ...fields, owner: "technique", credit: "Generated demo plate (synthetic)" });
}

/**
 * Generates the demo plate for a technique, stores it with its denoised twin, runs the
 * technique's recipe on it for the "after" still, and returns that recipe.
 */
async function attachGeneratedStills(author: SessionUser, slug: string, opts: { screen: "green" | "blue"; seed: number }): Promise<RecipeStep[]> {
  const synthetic = await generateSyntheticPlate({ width: STILL_WIDTH, height: STILL_HEIGHT, seed: opts.seed, screen: opts.screen });
  const plate = await storeStill(author, synthetic.plate, { technique: slug, alt: `Synthetic ${opts.screen} backing screen with tracking markers and a foreground shape`, caption: "Plate: uneven screen, mixed-hue markers, grain", role: "before" });
  const denoised = await storeStill(author, synthetic.denoised, { technique: slug, alt: "The same plate denoised, used for grain restore", caption: "Denoised plate", role: "reference" });
  const recipe = recipeSchema.parse(
    demoCleanupRecipe({ denoisedStillId: denoised.id, width: STILL_WIDTH, screen: synthetic.screen, markerSamples: synthetic.markerSamples, screenSamples: synthetic.screenSamples, screenRect: synthetic.screenRect }),
  );
  const result = await runRecipe({ still: synthetic.plate, steps: recipe, space: "linear", format: "png16", loadStill: async () => synthetic.denoised });
  const after = await storeStill(author, result.bytes, { technique: slug, alt: "The plate after the recipe: markers gone, grain restored", caption: "After: the technique's recipe, exact float render", role: "after" });
  await createPair(author, { technique: slug, before: plate.id, after: after.id, caption: "Tracking markers removed through the matte, grain restored" });
  return recipe;
}

function withAppended(body: TechniqueDocument, extra: TechniqueDocument["content"]): TechniqueDocument {
  return { ...body, content: [...body.content, ...extra] };
}

/** Walks each demo technique through the real lifecycle, so history and review look as they would. */
export async function seedTechniques(log: (line: string) => void): Promise<void> {
  const first = DEMO_TECHNIQUES[0];
  if (first && (await findTechniqueBySlug(slugify(first.title)))) {
    log("techniques: already there");
    return;
  }
  const emails = [...new Set(DEMO_TECHNIQUES.flatMap((t) => [t.author, ...(t.uses ?? []).map((u) => u.by)]).concat("lead@kestrel.test"))];
  const rows = await getDb().select().from(users).where(inArray(users.email, emails));
  const person = (email: string): SessionUser => {
    const u = rows.find((r) => r.email === email);
    if (!u) throw new Error(`Seed: no person ${email}`);
    return { id: u.id, email: u.email, name: u.name, role: u.role };
  };
  const lead = person("lead@kestrel.test");
  const slugs = new Map<string, string>();
  const approve = async (slug: string) => {
    const s = await submitTechnique(lead, slug);
    await reviewTechnique(lead, slug, { revision: s.revision, decision: "approve" });
  };

  // Replacements first, so a retired technique can point at an approved one.
  const ordered: DemoTechnique[] = [...DEMO_TECHNIQUES].sort((a, b) => Number(a.lifecycle === "retired-superseded") - Number(b.lifecycle === "retired-superseded"));
  for (const t of ordered) {
    const author = person(t.author);
    let { slug, revision } = await createTechnique(author, { title: t.title, summary: t.summary, aliases: t.aliases, tags: t.tags, body: t.body, recipe: [] });
    slugs.set(t.key, slug);
    const stills = WITH_STILLS[t.key];
    if (stills) {
      const recipe = await attachGeneratedStills(author, slug, stills);
      ({ slug, revision } = await updateTechnique(author, slug, { title: t.title, summary: t.summary, aliases: t.aliases, tags: t.tags, body: t.body, recipe, baseRevision: revision, changeNote: "Added the runnable recipe and the before/after stills." }));
    }
    if (t.lifecycle === "in-review") await submitTechnique(author, slug);
    if (t.lifecycle === "approved" || t.lifecycle === "in-review-edit" || t.lifecycle === "retired-superseded") await approve(slug);
    if (t.houseMethodFor) await setHouseMethod(lead, t.houseMethodFor, slug);
    for (const use of t.uses ?? []) await logUse(person(use.by), slug, { shot: use.shot, outcome: use.outcome, note: use.note });
    if (t.lifecycle === "in-review-edit" && t.edit) {
      const latest = await getTechnique(author, slug);
      await updateTechnique(author, slug, {
        title: t.title,
        summary: t.edit.summary ?? t.summary,
        aliases: t.aliases,
        tags: t.tags,
        body: withAppended(t.body, t.edit.bodyAppend),
        recipe: latest.recipe,
        baseRevision: latest.latestRevision,
        changeNote: t.edit.changeNote,
      });
      // A saved revision is a draft until submitted (lib/techniques/mutations.ts updateTechnique).
      await submitTechnique(author, slug);
    }
    log(`technique: ${t.title} (${t.lifecycle})`);
  }
  for (const t of DEMO_TECHNIQUES.filter((x) => x.lifecycle === "retired-superseded")) {
    const slug = slugs.get(t.key)!;
    await retireTechnique(lead, slug, { supersededBy: t.supersededBy ? slugs.get(t.supersededBy) : undefined, note: "Replaced by the channel-based method, which needs no hand painting." });
  }
  await seedConversation(slugs);
}

/** A little life around the techniques: followers, a question with its answer, an open request. */
async function seedConversation(slugs: Map<string, string>): Promise<void> {
  const rows = await getDb().select().from(users);
  const person = (email: string): SessionUser => {
    const u = rows.find((r) => r.email === email)!;
    return { id: u.id, email: u.email, name: u.name, role: u.role };
  };
  const marker = slugs.get("marker-channel-cleanup");
  if (!marker) return;
  const artist = person("artist@kestrel.test");
  await subscribe(artist, { target: { kind: "technique", key: marker }, mode: "immediate" });
  await subscribe(person("lena.strandberg@kestrel.test"), { target: { kind: "tag", key: "tracking-markers" }, mode: "daily" });
  const question = await askQuestion(artist, marker, documentFromText("Does the hide row still work when the markers are motion-blurred across two frames?"));
  const answerer = rows.find((r) => r.email === DEMO_TECHNIQUES.find((t) => t.key === "marker-channel-cleanup")?.author);
  if (answerer) {
    await answerQuestion(
      { id: answerer.id, email: answerer.email, name: answerer.name, role: answerer.role },
      question.id,
      documentFromText("Mostly. Sample the blurred edge as a second marker shade so the solve sees it, and grow the matte one or two pixels more."),
    );
  }
  await createRequest(person("dara.pellow@kestrel.test"), { query: "LED wall flicker on a night exterior", note: "Seen on two LTH shots; the screen pulses every few frames." });
}
