import { customType, pgTable, text, timestamp } from "drizzle-orm/pg-core";

/** Raw bytes (PGlite returns a Uint8Array, node-postgres a Buffer, which is one). */
const bytea = customType<{ data: Uint8Array; driverData: Uint8Array }>({ dataType: () => "bytea" });

/**
 * Page vectors for ranking by meaning (lib/search/meaning.ts), kept so a restart does not encode every
 * page again (~22 ms a page). A cache: keyed by a hash of the encoder's name and the text it read, so
 * it needs no link to techniques, and any row may be dropped and made again.
 */
export const searchMeaningVectors = pgTable("search_meaning_vectors", {
  /** SHA-256 (hex) of the encoder's name, a newline and the text encoded. */
  key: text("key").primaryKey(),
  /** The unit vector as little-endian float32s. */
  vector: bytea("vector").notNull(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});
