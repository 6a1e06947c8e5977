import "server-only";

import crypto from "node:crypto";
import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { searchMeaningVectors } from "@/db/schema";
import type { MeaningVectorStore } from "./meaning";

/** Rows per statement: keeps each insert's parameter list far under PostgreSQL's 65,535. */
const SAVE_CHUNK = 500;

/**
 * Page vectors in the database (table search_meaning_vectors), keyed by a hash of `modelId` and the
 * text, so vectors of another encoder are never read. Key lists travel as one JSON parameter, so
 * 50,000 pages' keys make one statement, not 100,000 parameters.
 */
export function databaseMeaningStore(modelId: string): MeaningVectorStore {
  const keyOf = (text: string): string => crypto.createHash("sha256").update(modelId).update("\n").update(text).digest("hex");
  const t = searchMeaningVectors;
  return {
    async load(texts) {
      const textByKey = new Map(texts.map((text) => [keyOf(text), text]));
      const rows = await getDb()
        .select({ key: t.key, vector: t.vector })
        .from(t)
        .where(sql`${t.key} in (select jsonb_array_elements_text(${JSON.stringify([...textByKey.keys()])}::jsonb))`);
      const out = new Map<string, Float32Array>();
      for (const row of rows) {
        const text = textByKey.get(row.key);
        // Copy: the driver's bytes may sit at an offset that is not a multiple of 4.
        if (text !== undefined && row.vector.byteLength % 4 === 0) out.set(text, new Float32Array(Uint8Array.from(row.vector).buffer));
      }
      return out;
    },
    async save(entries) {
      for (let i = 0; i < entries.length; i += SAVE_CHUNK) {
        const values = entries.slice(i, i + SAVE_CHUNK).map(([text, v]) => ({ key: keyOf(text), vector: new Uint8Array(v.buffer, v.byteOffset, v.byteLength) }));
        await getDb().insert(t).values(values).onConflictDoNothing();
      }
    },
    async keepOnly(texts) {
      const keys = JSON.stringify(texts.map(keyOf));
      await getDb()
        .delete(t)
        .where(sql`${t.key} not in (select jsonb_array_elements_text(${keys}::jsonb))`);
    },
  };
}
