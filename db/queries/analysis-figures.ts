import { and, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, analysisFigures, captures, units } from "@/db/schema";
import { analysisReportSchema } from "@/lib/analysis";
import { figureRowsOf } from "@/lib/trends/figure-rows";

// Writes the per-figure rows of analyses (see lib/trends/figure-rows.ts). Called inside the
// transaction that stores an analysis or a re-judgement, so the rows and the result agree.

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

/**
 * Marks the capture's earlier rows not current and writes those of its new current analysis. A
 * report that does not parse gets no rows (it cannot be trended) rather than failing the store.
 * `expanded_uncertainty` is the verdict's expanded uncertainty (k = 2) where the budget was evaluated.
 */
export async function writeFigureRows(tx: Tx, analysis: { id: string; captureId: string; planStepId: string | null; report: unknown }): Promise<number> {
  const { id: analysisId, captureId, planStepId, report } = analysis;
  await tx.update(analysisFigures).set({ current: false }).where(and(eq(analysisFigures.captureId, captureId), eq(analysisFigures.current, true)));
  const parsed = analysisReportSchema.safeParse(report);
  if (!parsed.success) return 0;
  const [owner] = await tx.select({ unitId: units.id, ratingId: units.ratingId, labId: captures.labId, measuredAt: captures.createdAt })
    .from(captures).innerJoin(units, eq(units.id, captures.unitId)).where(eq(captures.id, captureId)).limit(1);
  if (!owner) return 0;
  const rows = figureRowsOf(parsed.data).map((r) => ({ ...r, ...owner, analysisId, captureId, planStepId, current: true }));
  if (rows.length > 0) await tx.insert(analysisFigures).values(rows).onConflictDoNothing();
  return rows.length;
}

/**
 * Writes rows for current analyses that have none (results stored before trends were indexed).
 * Idempotent: an analysis with rows is skipped, so a second run writes nothing. Returns the count.
 */
export async function backfillAnalysisFigures(batchSize = 200): Promise<{ analyses: number; rows: number }> {
  let done = 0;
  let written = 0;
  // Keyset over ids: a report that yields no rows is not picked up again in the same run.
  let after: string | null = null;
  for (;;) {
    const batch: { id: string; captureId: string; planStepId: string | null; report: unknown }[] = await getDb()
      .select({ id: analyses.id, captureId: analyses.captureId, planStepId: analyses.planStepId, report: analyses.report }).from(analyses)
      .where(and(eq(analyses.current, true), sql`not exists (select 1 from ${analysisFigures} f where f.analysis_id = ${analyses.id})`,
        after !== null ? sql`${analyses.id} > ${after}` : undefined))
      .orderBy(analyses.id).limit(batchSize);
    for (const row of batch) {
      written += await getDb().transaction((tx) => writeFigureRows(tx, row));
      after = row.id;
      done++;
    }
    if (batch.length < batchSize) return { analyses: done, rows: written };
  }
}
