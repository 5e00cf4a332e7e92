import { and, desc, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, units } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

// The verdicts the review queue names. Only the verdicts array leaves the database, and only for the
// captures a page shows (records of failing steps, or each unit's latest capture): a unit can have
// hundreds of captures, and reading every report's verdicts made the queue page slow.

const verdictColumns = {
  unitId: captures.unitId, captureId: captures.id, createdAt: captures.createdAt, planStepId: analyses.planStepId,
  verdicts: sql<unknown>`${analyses.report} -> 'verdicts'`,
};

/** The verdicts of the current analyses of these (analysed) captures, within the scope. */
export async function listVerdictsOfCaptures(scope: Scope, captureIds: readonly string[]) {
  if (captureIds.length === 0) return [];
  return getDb()
    .select(verdictColumns)
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .where(and(unitScopeWhere(scope), inArray(captures.id, [...captureIds]), eq(captures.state, "analysed")))
    .limit(captureIds.length);
}

/** The verdicts of each unit's latest analysed capture (for units whose rating has no plan). */
export async function listLatestVerdicts(scope: Scope, unitIds: readonly string[]) {
  if (unitIds.length === 0) return [];
  return getDb()
    .selectDistinctOn([captures.unitId], verdictColumns)
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .where(and(unitScopeWhere(scope), inArray(captures.unitId, [...unitIds]), eq(captures.state, "analysed")))
    .orderBy(captures.unitId, desc(captures.createdAt));
}
