import { ESLint } from "eslint";
import tseslint from "typescript-eslint";
import { describe, expect, it } from "vitest";

/*
 * The layer rule of DEVELOPERS.md ("app -> components -> lib -> db, never upward"; nothing the
 * product runs imports tests, scripts or bench), as eslint.config.mjs enforces it: each probe
 * is linted as if it were a file in that folder. If the rule were dropped or loosened, the
 * repository's own lint would still pass; these probes would not.
 */
// The probes are not files of the TypeScript program, so the type-checked rules are off for them.
const eslint = new ESLint({ overrideConfig: tseslint.configs.disableTypeChecked });

async function restrictedImports(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return (result?.messages ?? []).filter((m) => m.ruleId === "import/no-restricted-paths").map((m) => /"([^"]+)"/.exec(m.message)?.[1] ?? m.message);
}

describe("ESLint refuses imports that point up the layers", { timeout: 60_000 }, () => {
  it("db/ imports nothing above it, not even the configuration in lib/env.ts", async () => {
    const code = [
      'import { cn } from "@/lib/utils";',
      'import { env } from "@/lib/env";',
      'import { Button } from "@/components/ui/button";',
      'import type { RouteEntry } from "@/tests/integration/security/route-table";',
      'import { seedDemo } from "@/scripts/seed/demo";',
      "export const probe = [cn, env, Button, seedDemo, null as RouteEntry | null];",
    ].join("\n");
    expect(await restrictedImports("db/probe.ts", code)).toEqual(["@/lib/utils", "@/lib/env", "@/components/ui/button", "@/tests/integration/security/route-table", "@/scripts/seed/demo"]);
  });

  it("lib/ imports neither components, app, scripts nor tests; relative paths count too", async () => {
    const code = [
      'import { Button } from "@/components/ui/button";',
      'import { GET } from "../../app/api/me/route";',
      'import { startFakeSmtp } from "@/scripts/fake-smtp/server";',
      'import { getDb } from "@/db/client";',
      "export const probe = [Button, GET, startFakeSmtp, getDb];",
    ].join("\n");
    expect(await restrictedImports("lib/techniques/probe.ts", code)).toEqual(["@/components/ui/button", "../../app/api/me/route", "@/scripts/fake-smtp/server"]);
  });

  it("components/ never import app/ or db/, type-only imports included", async () => {
    const code = [
      'import { GET } from "@/app/api/me/route";',
      'import { getDb } from "@/db/client";',
      'import type { POST } from "@/app/api/lab/run/route";',
      'import type { LabAnalyseResponse } from "@/lib/lab/analysis-schemas";',
      'import { cn } from "@/lib/utils";',
      "export const probe = [GET, getDb, cn, null as LabAnalyseResponse | null, null as typeof POST | null];",
    ].join("\n");
    expect(await restrictedImports("components/lab/probe.ts", code)).toEqual(["@/app/api/me/route", "@/db/client", "@/app/api/lab/run/route"]);
  });

  it("app/ reaches the database only through lib/", async () => {
    const code = ['import { getDb } from "@/db/client";', 'import { databaseAnswers } from "@/lib/health";', "export const probe = [getDb, databaseAnswers];"].join("\n");
    expect(await restrictedImports("app/api/probe/route.ts", code)).toEqual(["@/db/client"]);
  });

  it("tests and scripts may import every layer", async () => {
    const code = ['import { getDb } from "@/db/client";', 'import { GET } from "@/app/api/me/route";', 'import { Button } from "@/components/ui/button";', "export const probe = [getDb, GET, Button];"].join("\n");
    expect(await restrictedImports("tests/unit/probe.test.ts", code)).toEqual([]);
    expect(await restrictedImports("scripts/probe.ts", code)).toEqual([]);
  });
});
