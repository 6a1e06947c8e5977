// @vitest-environment jsdom
import { act } from "react";
import { createRoot, type Root } from "react-dom/client";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { ShotImport } from "@/components/shots/shot-import";
import { csvRecordsToRows, planImport, readShotCsv } from "@/lib/shots/csv";
import { columnMappingSchema, type ImportShotsResponse } from "@/lib/shots/schemas";
import { DEFAULT_SHOT_PATTERN } from "@/lib/shows/schemas";

// The "server" here is the real planner on the posted CSV, so the preview shows what the
// import code decides; only the network is replaced.
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const LIST = [
  "Shot Code,Notes,Cut In,Cut Out",
  "SLM_040_0120,markers,1001,1096",
  "SLM_40_130,broken code,1001,1010",
  "SLM_040_0120,again,1001,1096",
].join("\r\n");

let container: HTMLDivElement;
let root: Root;
const posted: { csv: string; mapping: unknown; dryRun: boolean }[] = [];

beforeEach(() => {
  container = document.createElement("div");
  document.body.append(container);
  root = createRoot(container);
  posted.length = 0;
  vi.stubGlobal(
    "fetch",
    vi.fn(async (_url: string, init: RequestInit) => {
      const body = JSON.parse(String(init.body)) as { csv: string; mapping: unknown; dryRun: boolean };
      posted.push(body);
      const mapping = columnMappingSchema.parse(body.mapping);
      const plan = planImport(csvRecordsToRows(readShotCsv(body.csv, mapping).rows), new Map(), { code: "SLM", shotPattern: DEFAULT_SHOT_PATTERN });
      const res: ImportShotsResponse = {
        dryRun: body.dryRun,
        created: plan.create.length,
        updated: plan.update.length,
        unchanged: plan.unchanged.length,
        errors: plan.errors,
        ...(body.dryRun ? { preview: { create: plan.create, update: plan.update, unchanged: plan.unchanged } } : {}),
      };
      return new Response(JSON.stringify(res), { status: 200, headers: { "Content-Type": "application/json" } });
    }),
  );
});

afterEach(() => {
  act(() => root.unmount());
  container.remove();
  vi.unstubAllGlobals();
});

function type(el: HTMLTextAreaElement, value: string) {
  const setter = Object.getOwnPropertyDescriptor(HTMLTextAreaElement.prototype, "value")!.set!;
  setter.call(el, value);
  el.dispatchEvent(new Event("input", { bubbles: true }));
}
const button = (label: RegExp) => [...container.querySelectorAll("button")].find((b) => label.test(b.textContent ?? ""))!;

describe("ShotImport", () => {
  it("guesses the mapping, previews errors with reasons, then commits the same mapping", async () => {
    const onImported = vi.fn();
    act(() => root.render(<ShotImport showCode="SLM" onImported={onImported} />));
    act(() => type(container.querySelector("textarea")!, LIST));

    const select = (h: string) => container.querySelector<HTMLSelectElement>(`select[aria-label="Field for column ${h}"]`)!.value;
    expect([select("Shot Code"), select("Notes"), select("Cut In"), select("Cut Out")]).toEqual(["code", "description", "frameStart", "frameEnd"]);

    await act(async () => button(/Preview import/).click());
    expect(posted[0]).toMatchObject({ dryRun: true, mapping: { code: "Shot Code", description: "Notes" } });
    const text = container.textContent ?? "";
    expect(text).toContain("SLM_40_130 is not a shot code of SLM: they look like SLM_040_0120");
    expect(text).toContain("SLM_040_0120 appears more than once; first on row 1.");

    await act(async () => button(/Import 1 new and 0 changed/).click());
    expect(posted[1]).toMatchObject({ dryRun: false, mapping: posted[0]!.mapping });
    expect(onImported).toHaveBeenCalledOnce();
    expect(container.textContent).toContain("Imported: 1 new, 0 changed, 0 unchanged. 2 rows were not imported:");
  });

  it("counts one row as one row (issue 13)", async () => {
    act(() => root.render(<ShotImport showCode="SLM" />));
    act(() => type(container.querySelector("textarea")!, "Shot Code,Notes\r\nSLM_040_0120,markers\r\nSLM_7,typo\r\n"));
    expect(container.textContent).toContain("2 rows read.");
    await act(async () => button(/Preview import/).click());
    expect(button(/^Import 1 new and 0 changed shot$/)).toBeDefined();
    await act(async () => button(/Import 1 new/).click());
    expect(container.textContent).toContain("Imported: 1 new, 0 changed, 0 unchanged. 1 row was not imported:");
    expect(container.textContent).not.toMatch(/\\d\{|\^SLM/);
  });

  it("blocks the preview until a column is mapped to the shot code", () => {
    act(() => root.render(<ShotImport showCode="SLM" />));
    act(() => type(container.querySelector("textarea")!, "Foo,Bar\n1,2\n"));
    expect(container.textContent).toContain("No column for the shot code was found");
    expect(button(/Preview import/).disabled).toBe(true);
  });
});
