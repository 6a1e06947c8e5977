import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { subscriptions, techniqueSlugHistory, users } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/roles";
import { getSubscription, isSubscribed, listSubscriptions } from "@/lib/subscriptions/queries";
import { renameTechniqueSubscriptions, setMailMode, subscribe, unsubscribe } from "@/lib/subscriptions/mutations";
import { makeShow, makeTag, makeTechnique, makeUser } from "./factories";

describe("subscriptions DAL", () => {
  it("follows a technique, tag and show by their keys, lists them with labels, and unfollows", async () => {
    const artist = await makeUser();
    const technique = await makeTechnique({ title: "Grain-matched patch" });
    const tag = await makeTag({ name: "Wire removal" });
    await makeShow({ code: "LTH", name: "The Long Thaw" });

    const t = await subscribe(artist, { target: { kind: "technique", key: technique.slug }, mode: "immediate" });
    expect(t).toMatchObject({ target: { kind: "technique", key: technique.slug }, mode: "immediate", label: "Grain-matched patch" });
    await subscribe(artist, { target: { kind: "tag", key: tag.slug.toUpperCase() } });
    // Show codes are matched regardless of case and stored as the show spells its code.
    const s = await subscribe(artist, { target: { kind: "show", key: "lth" }, mode: "daily" });
    expect(s.target).toEqual({ kind: "show", key: "LTH" });
    expect(s.label).toBe("LTH · The Long Thaw");

    const list = await listSubscriptions(artist);
    expect(list.mailMode).toBe("immediate");
    expect(list.items.map((i) => `${i.target.kind}:${i.target.key}:${i.mode}`).sort()).toEqual(
      [`show:LTH:daily`, `tag:${tag.slug}:immediate`, `technique:${technique.slug}:immediate`].sort(),
    );
    expect(await isSubscribed(artist, "tag", tag.slug)).toBe(true);

    expect(await unsubscribe(artist, { kind: "tag", key: tag.slug })).toEqual({ removed: true });
    expect(await unsubscribe(artist, { kind: "tag", key: tag.slug })).toEqual({ removed: false });
    expect(await isSubscribed(artist, "tag", tag.slug)).toBe(false);
  });

  it("following again changes only the mode (one row per target)", async () => {
    const artist = await makeUser();
    const tag = await makeTag();
    await subscribe(artist, { target: { kind: "tag", key: tag.slug }, mode: "immediate" });
    await subscribe(artist, { target: { kind: "tag", key: tag.slug }, mode: "daily" });
    const rows = await getDb().select().from(subscriptions).where(eq(subscriptions.userId, artist.id));
    expect(rows).toHaveLength(1);
    expect(rows[0]!.mode).toBe("daily");
  });

  it("unknown targets are not found, and artists cannot follow an unapproved draft", async () => {
    const artist = await makeUser();
    const senior = await makeUser({ role: "senior" });
    const draft = await makeTechnique({ status: "draft" });
    for (const target of [
      { kind: "technique", key: "no-such-technique" },
      { kind: "tag", key: "no-such-tag" },
      { kind: "show", key: "XYZ" },
      { kind: "technique", key: draft.slug },
    ] as const) {
      await expect(subscribe(artist, { target })).rejects.toMatchObject({ code: "not_found" });
    }
    await expect(subscribe(senior, { target: { kind: "technique", key: draft.slug } })).resolves.toMatchObject({ target: { key: draft.slug } });
  });

  it("an old technique slug resolves to the current one", async () => {
    const artist = await makeUser();
    const technique = await makeTechnique();
    await getDb().insert(techniqueSlugHistory).values({ slug: `${technique.slug}-old`, techniqueId: technique.id });
    const s = await subscribe(artist, { target: { kind: "technique", key: `${technique.slug}-old` } });
    expect(s.target.key).toBe(technique.slug);

    // A rename moves existing followers with it.
    await getDb().transaction((tx) => renameTechniqueSubscriptions(tx, technique.slug, `${technique.slug}-new`));
    expect(await isSubscribed(artist, "technique", `${technique.slug}-new`)).toBe(true);
    expect(await isSubscribed(artist, "technique", technique.slug)).toBe(false);
  });

  it("the mail mode applies to everything followed and is the default for new follows", async () => {
    const artist = await makeUser();
    const [a, b] = [await makeTag(), await makeTag()];
    await subscribe(artist, { target: { kind: "tag", key: a.slug }, mode: "immediate" });
    expect(await setMailMode(artist, "daily")).toEqual({ mailMode: "daily" });
    expect((await getSubscription(artist, "tag", a.slug))!.mode).toBe("daily");
    expect((await subscribe(artist, { target: { kind: "tag", key: b.slug } })).mode).toBe("daily");
    const [u] = await getDb().select().from(users).where(eq(users.id, artist.id));
    expect(u!.mailMode).toBe("daily");
  });

  it("every function checks subscription:manage (deny by default, OWASP ASVS 4.0.3 V4.1, from memory)", async () => {
    const nobody = { id: "00000000-0000-4000-8000-000000000000", email: "x@kestrel.test", name: "X", role: "guest" } as unknown as SessionUser;
    await expect(listSubscriptions(nobody)).rejects.toMatchObject({ code: "forbidden" });
    await expect(subscribe(nobody, { target: { kind: "tag", key: "x" } })).rejects.toMatchObject({ code: "forbidden" });
    await expect(unsubscribe(nobody, { kind: "tag", key: "x" })).rejects.toMatchObject({ code: "forbidden" });
    await expect(setMailMode(nobody, "daily")).rejects.toMatchObject({ code: "forbidden" });
    await expect(isSubscribed(nobody, "tag", "x")).rejects.toMatchObject({ code: "forbidden" });
  });
});
