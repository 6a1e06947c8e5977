/**
 * `npm run mail:flush`: sends everything due in the outbox now and exits.
 * `--digest` first composes the daily digests due today. Run with
 * `tsx --conditions=react-server` so `server-only` imports resolve outside Next.js.
 */
import { closeDb } from "@/db/client";
import { composeDigests, flushUntilIdle } from "@/lib/mail/sender";
import { env } from "@/lib/env";

async function main(): Promise<void> {
  if (process.argv.includes("--digest")) {
    const d = await composeDigests(new Date());
    console.log(`digests composed: ${d.digests} (${d.items} items)`);
  }
  const r = await flushUntilIdle();
  console.log(
    `outbox via ${env.SMTP_URL}: sent ${r.sent}, retry later ${r.retried}, failed ${r.failed}, ` +
      `server unreachable (kept queued) ${r.deferred}, recovered from a stopped sender ${r.recovered}`,
  );
  if (r.deferred > 0) process.exitCode = 2;
}

main()
  .catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  })
  .finally(() => closeDb());
