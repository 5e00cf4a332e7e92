import { backfillAnalysisFigures } from "@/db/queries/analysis-figures";
import { closeDb } from "@/db/queries/connection";
import { runMigrations } from "@/db/queries/migrate";
import { backfillPlanStandings } from "@/db/queries/unit-plan";

try {
  await runMigrations();
  console.log("migrations applied");
  // Trend rows for results stored before they were indexed; idempotent, so every run may do it.
  const filled = await backfillAnalysisFigures();
  if (filled.analyses > 0) console.log(`trend figures written for ${filled.analyses} stored analyses (${filled.rows} rows)`);
  // The plan standing the review queue reads, for open units whose state was stored before it was kept.
  const standings = await backfillPlanStandings();
  if (standings > 0) console.log(`plan standing stored for ${standings} open units`);
} catch (err) {
  console.error(`migration failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
