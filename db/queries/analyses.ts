import { and, desc, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, planSteps, toleranceProfiles, units, type Analysis } from "@/db/schema";
import { writeFigureRows } from "./analysis-figures";
import { captureScopeWhere } from "./captures";
import { unitScopeWhere, type Scope } from "./scope";

export type NewAnalysis = Omit<typeof analyses.$inferInsert, "id" | "current" | "createdAt">;

/**
 * Stores a finished analysis as the capture's current one (earlier runs stay, marked not current),
 * moves the capture to analysed and refreshes the unit's latest verdict when this capture is its newest.
 * Returns false when the capture was no longer awaiting analysis (another run finished first).
 */
export async function recordAnalysis(scope: Scope, input: NewAnalysis): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const now = new Date();
    const moved = await tx
      .update(captures)
      .set({ state: "analysed", progress: 100, stateMessage: null, analysedAt: now, updatedAt: now })
      .where(and(eq(captures.id, input.captureId), inArray(captures.state, ["queued", "analysing", "analysed"]), captureScopeWhere(scope)))
      .returning({ unitId: captures.unitId, createdAt: captures.createdAt });
    const capture = moved[0];
    if (!capture) return false;
    await tx.update(analyses).set({ current: false }).where(and(eq(analyses.captureId, input.captureId), eq(analyses.current, true)));
    const [stored] = await tx.insert(analyses).values({ ...input, current: true }).returning({ id: analyses.id });
    if (stored) await writeFigureRows(tx, { id: stored.id, captureId: input.captureId, planStepId: input.planStepId ?? null, report: input.report });
    await tx
      .update(units)
      .set({ latestOverall: input.overall ?? null, latestCaptureAt: capture.createdAt })
      .where(
        and(
          eq(units.id, capture.unitId),
          unitScopeWhere(scope),
          sql`(${units.latestCaptureAt} is null or ${units.latestCaptureAt} <= ${capture.createdAt.toISOString()})`,
        ),
      );
    return true;
  });
}

export async function getCurrentAnalysis(scope: Scope, captureId: string): Promise<(Analysis & { profileVersion: number | null; stepName: string | null }) | undefined> {
  const rows = await getDb()
    .select({ analysis: analyses, profileVersion: toleranceProfiles.version, stepName: planSteps.name })
    .from(analyses)
    .innerJoin(captures, eq(captures.id, analyses.captureId))
    .innerJoin(units, eq(units.id, captures.unitId))
    .leftJoin(toleranceProfiles, eq(toleranceProfiles.id, analyses.profileVersionId))
    .leftJoin(planSteps, eq(planSteps.id, analyses.planStepId))
    .where(and(eq(analyses.captureId, captureId), eq(analyses.current, true), unitScopeWhere(scope)))
    .limit(1);
  const row = rows[0];
  return row ? { ...row.analysis, profileVersion: row.profileVersion, stepName: row.stepName } : undefined;
}

/** Earlier and current runs of one capture, newest first, without the bulky columns. */
export async function listAnalysisHistory(scope: Scope, captureId: string) {
  return getDb()
    .select({
      id: analyses.id, analysisVersion: analyses.analysisVersion, toleranceDigest: analyses.toleranceDigest, current: analyses.current,
      overall: analyses.overall, createdAt: analyses.createdAt, kind: analyses.kind, profileVersion: toleranceProfiles.version, stepName: planSteps.name,
    })
    .from(analyses)
    .innerJoin(captures, eq(captures.id, analyses.captureId))
    .innerJoin(units, eq(units.id, captures.unitId))
    .leftJoin(toleranceProfiles, eq(toleranceProfiles.id, analyses.profileVersionId))
    .leftJoin(planSteps, eq(planSteps.id, analyses.planStepId))
    .where(and(eq(analyses.captureId, captureId), unitScopeWhere(scope)))
    .orderBy(desc(analyses.createdAt));
}

/**
 * Stores a re-judgement of an analysed capture (the same figures judged against another profile
 * version or plan step) as its current analysis; the earlier one stays in history. Refreshes the unit's
 * latest verdict when this capture is its newest. False when the capture is no longer analysed.
 */
export async function recordRejudgement(scope: Scope, input: NewAnalysis): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const [capture] = await tx.select({ unitId: captures.unitId, createdAt: captures.createdAt }).from(captures)
      .where(and(eq(captures.id, input.captureId), eq(captures.state, "analysed"), captureScopeWhere(scope))).for("update");
    if (!capture) return false;
    await tx.update(analyses).set({ current: false }).where(and(eq(analyses.captureId, input.captureId), eq(analyses.current, true)));
    const [stored] = await tx.insert(analyses).values({ ...input, current: true, kind: "rejudge" }).returning({ id: analyses.id });
    if (stored) await writeFigureRows(tx, { id: stored.id, captureId: input.captureId, planStepId: input.planStepId ?? null, report: input.report });
    await tx.update(units).set({ latestOverall: input.overall ?? null }).where(
      and(eq(units.id, capture.unitId), unitScopeWhere(scope), sql`${units.latestCaptureAt} = ${capture.createdAt.toISOString()}`),
    );
    return true;
  });
}

/** Analysed captures whose current result a re-judge would replace: one capture, one unit or a whole rating. */
export async function listRejudgeCandidates(scope: Scope, target: { captureId: string } | { unitId: string } | { ratingId: string }, afterId: string | null, limit: number) {
  const which = "captureId" in target ? eq(captures.id, target.captureId) : "unitId" in target ? eq(captures.unitId, target.unitId) : eq(units.ratingId, target.ratingId);
  return getDb()
    .select({ capture: captures, analysis: analyses, unitId: units.id, ratingId: units.ratingId })
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .where(and(which, eq(captures.state, "analysed"), unitScopeWhere(scope), afterId ? sql`${captures.id} > ${afterId}` : undefined))
    .orderBy(captures.id)
    .limit(limit);
}
