import { and, asc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, ratings, units } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

/** Ratings that have at least one unit in scope, with how many units carry each. */
export async function listRatingsInScope(scope: Scope) {
  return getDb()
    .select({ id: ratings.id, modelCode: ratings.modelCode, title: ratings.title, nameplate: ratings.nameplate, unitCount: sql<number>`count(*)`.mapWith(Number) })
    .from(ratings)
    .innerJoin(units, eq(units.ratingId, ratings.id))
    .where(unitScopeWhere(scope))
    .groupBy(ratings.id)
    .orderBy(asc(ratings.modelCode));
}

/** One point per analysed capture of a rating's units (current analysis only), oldest first. */
export async function listTrendPoints(scope: Scope, ratingId: string, limit = 2000) {
  return getDb()
    .select({
      unitId: units.id, serial: units.serial, capturedAt: captures.createdAt, testKind: captures.testKind, overall: analyses.overall,
      frequencyHz: analyses.frequencyHz, worstThdPercent: analyses.worstThdPercent, vufPercent: analyses.vufPercent,
      keLineRmsPerKrpm: analyses.keLineRmsPerKrpm,
    })
    .from(analyses)
    .innerJoin(captures, eq(captures.id, analyses.captureId))
    .innerJoin(units, eq(units.id, captures.unitId))
    .where(and(unitScopeWhere(scope), eq(units.ratingId, ratingId), eq(analyses.current, true)))
    .orderBy(asc(captures.createdAt))
    .limit(limit);
}
