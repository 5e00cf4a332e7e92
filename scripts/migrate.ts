import { closeDb } from "@/db/client";
import { runMigrations } from "@/db/migrate";

try {
  await runMigrations();
  console.log("migrations applied");
} catch (err) {
  console.error(`migration failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
