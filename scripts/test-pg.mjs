// The second integration run, against a PostgreSQL server (PLATEROOM_TEST_PG_URL, an admin URL).
// .ci/run starts one; locally it is skipped unless you set the URL. In CI it must run.
import { spawnSync } from "node:child_process";

const url = process.env.PLATEROOM_TEST_PG_URL;
if (!url) {
  if (process.env.CI) {
    console.error("PLATEROOM_TEST_PG_URL is not set: CI must run the integration suite against PostgreSQL (see .ci/run).");
    process.exit(1);
  }
  console.log("Skipping the PostgreSQL integration run: set PLATEROOM_TEST_PG_URL (see .ci/start-postgres.sh).");
  process.exit(0);
}
const result = spawnSync("npx", ["vitest", "run", "--project", "integration"], { stdio: "inherit", env: { ...process.env, PLATEROOM_TEST_DB: "pg" } });
process.exit(result.status ?? 1);
