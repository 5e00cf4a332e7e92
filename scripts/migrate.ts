import { backfillAnalysisFigures } from "@/db/queries/analysis-figures";
import { closeDb } from "@/db/queries/connection";
import { runMigrations } from "@/db/queries/migrate";

try {
  await runMigrations();
  console.log("migrations applied");
  // Trend rows for results stored before they were indexed; idempotent, so every run may do it.
  const filled = await backfillAnalysisFigures();
  if (filled.analyses > 0) console.log(`trend figures written for ${filled.analyses} stored analyses (${filled.rows} rows)`);
} catch (err) {
  console.error(`migration failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
