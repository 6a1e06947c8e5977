import { bigint, integer, pgTable } from "drizzle-orm/pg-core";

/**
 * One row whose value goes up in the same transaction as any change to what pages show
 * (triggers in migration 0001). Cached pages remember the value they were rendered at, so a
 * change made by any app instance retires them at once.
 */
export const changeStamp = pgTable("change_stamp", {
  id: integer("id").primaryKey(),
  value: bigint("value", { mode: "number" }).notNull().default(0),
});
