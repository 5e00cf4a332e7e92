import { and, desc, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, units } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

/**
 * The verdicts of the current analyses of these units' captures (analysed ones), newest capture first,
 * for the review queue to name what failed. Only the verdicts array leaves the database.
 */
export async function listCurrentVerdicts(scope: Scope, unitIds: readonly string[]) {
  if (unitIds.length === 0) return [];
  return getDb()
    .select({
      unitId: captures.unitId, captureId: captures.id, createdAt: captures.createdAt, planStepId: analyses.planStepId,
      verdicts: sql<unknown>`${analyses.report} -> 'verdicts'`,
    })
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .where(and(unitScopeWhere(scope), inArray(captures.unitId, [...unitIds]), eq(captures.state, "analysed")))
    .orderBy(desc(captures.createdAt))
    .limit(5000);
}
