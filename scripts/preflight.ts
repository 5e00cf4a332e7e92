// Stops start-up with the name of any service the app cannot reach (and of any bad variable).
import { closeDb } from "@/db/queries/connection";
import { checkServices } from "@/lib/server/preflight";

try {
  const results = await checkServices();
  for (const r of results) console.log(`${r.ok ? "ok  " : "DOWN"} ${r.service.padEnd(13)} ${r.detail}`);
  const down = results.filter((r) => !r.ok);
  if (down.length > 0) {
    console.error(`cannot start: ${down.map((r) => r.service).join(", ")} unreachable (bash scripts/services.sh status)`);
    process.exitCode = 1;
  }
} catch (err) {
  console.error(err instanceof Error ? err.message : String(err));
  process.exitCode = 1;
} finally {
  await closeDb();
}
