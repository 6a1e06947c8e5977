import "server-only";
import { z } from "zod";

/**
 * The database's part of the configuration. db/ is the bottom layer, so the variables it needs
 * are declared here; lib/env.ts extends this schema with everything else and reads process.env
 * by the same rules (readConfig), so each variable still has one definition.
 */
export const databaseEnvSchema = z.object({
  PLATEROOM_DATA_DIR: z.string().min(1).default("./.data"),
  DATABASE_URL: z.string().url().optional(),
});

/** Parses process.env with a schema; a bad value stops the process with every problem named. */
export function readConfig<Schema extends z.ZodType>(schema: Schema): z.infer<Schema> {
  if (process.env.SKIP_ENV_VALIDATION) return schema.parse({});
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
    throw new Error(`Invalid configuration: ${problems}`);
  }
  return parsed.data;
}

export const databaseEnv = readConfig(databaseEnvSchema);
