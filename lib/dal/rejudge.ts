import "server-only";
import { listRejudgeCandidates, recordRejudgement } from "@/db/queries/analyses";
import { getRatingById } from "@/db/queries/judgement";
import { refreshUnitPlanState } from "@/db/queries/unit-plan";
import type { Rating } from "@/db/schema";
import { analysisReportSchema, judgeReport, ratingSchema, toleranceProfileSchema } from "@/lib/analysis";
import { HttpError } from "@/lib/auth/guards";
import { loadJudgement, toleranceDigest } from "@/lib/server/judgement";
import type { Actor } from "./actor";

const BATCH = 200;

export type RejudgeTarget = { captureId: string } | { unitId: string } | { ratingId: string };

/**
 * Judges the stored figures of analysed captures again against the profile version in force and their
 * plan step, without reading the files; each gets a new current result and keeps the earlier one in its
 * history. Lab managers and quality engineers only. Returns how many captures were re-judged.
 */
export async function requestRejudge(actor: Actor, target: RejudgeTarget): Promise<{ rejudged: number; unchanged: number }> {
  if (actor.scope.kind !== "lab" || (actor.role !== "admin" && actor.role !== "qa")) throw new HttpError(403, "Only lab managers and quality engineers may re-judge captures");
  const scope = actor.scope;
  const ratings = new Map<string, Rating | undefined>();
  const units = new Set<string>();
  let rejudged = 0;
  let unchanged = 0;
  let after: string | null = null;
  for (;;) {
    const batch = await listRejudgeCandidates(scope, target, after, BATCH);
    for (const row of batch) {
      after = row.capture.id;
      if (!ratings.has(row.ratingId)) ratings.set(row.ratingId, await getRatingById(row.ratingId));
      const rating = ratings.get(row.ratingId);
      const stored = analysisReportSchema.safeParse(row.analysis.report);
      const nameplate = ratingSchema.safeParse(rating?.nameplate);
      if (!rating || !stored.success || !nameplate.success) continue;
      const judgement = await loadJudgement(rating, row.capture);
      const digest = toleranceDigest(rating, judgement.profile, judgement.step);
      if (digest === row.analysis.toleranceDigest) {
        unchanged++;
        continue;
      }
      const report = judgeReport(stored.data, {
        rating: nameplate.data, profile: toleranceProfileSchema.parse(judgement.profile.profile), checks: judgement.step?.checks, stepName: judgement.step?.name,
      });
      const { id: _id, createdAt: _at, current: _current, ...figures } = row.analysis;
      void _id; void _at; void _current;
      const saved = await recordRejudgement(scope, {
        ...figures, report, overall: report.overall, toleranceDigest: digest, profileVersionId: judgement.profile.id, planStepId: judgement.step?.id ?? null, kind: "rejudge",
      });
      if (saved) {
        rejudged++;
        units.add(row.unitId);
      }
    }
    if (batch.length < BATCH) break;
  }
  for (const unitId of units) await refreshUnitPlanState(scope, unitId);
  if ("captureId" in target && rejudged + unchanged === 0) throw new HttpError(409, "This capture has no analysed result to judge again");
  return { rejudged, unchanged };
}
