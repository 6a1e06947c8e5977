import { describe, expect, it } from "vitest";
import { GET as listShows } from "@/app/api/shows/route";
import { GET as getShow } from "@/app/api/shows/[code]/route";
import { getDb } from "@/db/client";
import { shots, shows } from "@/db/schema";
import { apiRequest, createPerson, params } from "@/tests/factories";

describe("show shot counts", () => {
  it("counts each show's own shots in the list and on the show", async () => {
    const [a] = await getDb().insert(shows).values({ code: "CNA", name: "Count A", shotPattern: "^CNA_\\d{3}_\\d{4}$" }).returning();
    const [b] = await getDb().insert(shows).values({ code: "CNB", name: "Count B", shotPattern: "^CNB_\\d{3}_\\d{4}$" }).returning();
    await getDb().insert(shots).values([
      { showId: a!.id, code: "CNA_010_0010", sequence: "010" },
      { showId: a!.id, code: "CNA_010_0020", sequence: "010" },
      { showId: a!.id, code: "CNA_020_0010", sequence: "020" },
      { showId: b!.id, code: "CNB_010_0010", sequence: "010" },
    ]);
    const artist = await createPerson("artist");
    const list = (await (await listShows(apiRequest("GET", "/api/shows", artist), params({}))).json()) as { items: Array<{ code: string; shotCount: number }> };
    expect(list.items.find((s) => s.code === "CNA")?.shotCount).toBe(3);
    expect(list.items.find((s) => s.code === "CNB")?.shotCount).toBe(1);
    const one = await (await getShow(apiRequest("GET", "/api/shows/CNA", artist), params({ code: "CNA" }))).json();
    expect(one.shotCount).toBe(3);
  });
});
