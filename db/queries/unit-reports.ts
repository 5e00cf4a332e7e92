import { and, asc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, stations, units } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

/** The current analysis of every analysed capture of a unit, oldest capture first: a test record's body. */
export async function listCurrentReportsForUnit(scope: Scope, unitId: string) {
  return getDb()
    .select({
      captureId: captures.id, createdAt: captures.createdAt, testKind: captures.testKind, speedRpm: captures.speedRpm,
      originalName: captures.originalName, sha256: captures.sha256, station: stations.name,
      analysisVersion: analyses.analysisVersion, analysedAt: analyses.createdAt, report: analyses.report,
    })
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .leftJoin(stations, eq(stations.id, captures.stationId))
    .where(and(unitScopeWhere(scope), eq(captures.unitId, unitId), eq(captures.state, "analysed")))
    .orderBy(asc(captures.createdAt))
    .limit(200);
}
