import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createBackup, restoreBackup } from "@/lib/backup/archive";
import { seededTemplate } from "@/tests/e2e/harness";

/** Every table's rows, in a stable order, as one digest per table. */
async function tableDigests(pgDir: string): Promise<Record<string, { rows: number; digest: string }>> {
  const db = new PGlite(pgDir);
  const { rows: tables } = await db.query<{ name: string }>(
    "select format('%I.%I', schemaname, tablename) as name from pg_tables where schemaname in ('public', 'drizzle') order by 1",
  );
  const out: Record<string, { rows: number; digest: string }> = {};
  for (const { name } of tables) {
    const { rows } = await db.query<{ n: number; d: string | null }>(
      `select count(*)::int as n, md5(coalesce(string_agg(t::text, '|' order by t::text), '')) as d from ${name} t`,
    );
    out[name] = { rows: rows[0]!.n, digest: rows[0]!.d ?? "" };
  }
  await db.close();
  return out;
}

function fileDigests(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  const walk = (d: string) => {
    for (const e of fs.readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else if (!path.relative(dir, p).startsWith("tmp")) out[path.relative(dir, p)] = crypto.createHash("sha256").update(fs.readFileSync(p)).digest("hex");
    }
  };
  walk(dir);
  return out;
}

describe("backup and restore of the demo data", () => {
  let work: string;
  let source: { dataDir: string; uploadsDir: string };
  beforeAll(() => {
    const template = seededTemplate();
    work = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-backup-test-"));
    source = { dataDir: path.join(work, "source-data"), uploadsDir: path.join(work, "source-uploads") };
    fs.cpSync(template.data, source.dataDir, { recursive: true });
    fs.cpSync(template.uploads, source.uploadsDir, { recursive: true });
  }, 600_000);
  afterAll(() => fs.rmSync(work, { recursive: true, force: true }));

  it("restores every table row and every stored still exactly into an empty folder", async () => {
    const archive = path.join(work, "backup.tar.gz");
    const manifest = await createBackup(source, archive);
    expect(manifest.files).toBeGreaterThan(0);
    const target = { dataDir: path.join(work, "restored-data"), uploadsDir: path.join(work, "restored-uploads") };
    await restoreBackup(archive, target);

    const before = await tableDigests(path.join(source.dataDir, "pg"));
    const after = await tableDigests(path.join(target.dataDir, "pg"));
    expect(Object.keys(before).length).toBeGreaterThan(15);
    expect(before["public.techniques"]!.rows).toBeGreaterThanOrEqual(8);
    expect(after).toEqual(before);

    const storedBefore = fileDigests(source.uploadsDir);
    expect(Object.keys(storedBefore).length).toBe(manifest.files);
    expect(fileDigests(target.uploadsDir)).toEqual(storedBefore);
  });

  it("refuses to restore over existing data", async () => {
    const archive = path.join(work, "again.tar.gz");
    await createBackup(source, archive);
    await expect(restoreBackup(archive, source)).rejects.toThrow(/not empty|already holds/);
  });
});
