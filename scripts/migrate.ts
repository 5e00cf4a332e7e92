import { closeDb } from "@/db/queries/connection";
import { runMigrations } from "@/db/queries/migrate";

try {
  await runMigrations();
  console.log("migrations applied");
} catch (err) {
  console.error(`migration failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
