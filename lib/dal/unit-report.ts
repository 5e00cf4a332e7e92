import "server-only";
import { z } from "zod";
import { listCurrentReportsForUnit } from "@/db/queries/unit-reports";
import { getUnit } from "@/db/queries/units";
import { analysisReportSchema, type AnalysisReport } from "@/lib/analysis";
import { requireApiUser } from "@/lib/auth/guards";
import { scopeFor } from "./scope";

export type UnitRecord = {
  serial: string; modelCode: string; ratingTitle: string; owner: string; disposition: string;
  nameplate: Record<string, unknown>; generatedAt: Date;
  captures: { captureId: string; createdAt: Date; testKind: string; speedRpm: number | null; originalName: string; sha256: string; station: string | null; analysisVersion: string; report: AnalysisReport }[];
};

/** Everything a per-serial test record shows; null when the unit is missing or out of the caller's scope. */
export async function getUnitRecord(unitId: string): Promise<UnitRecord | null> {
  const user = await requireApiUser();
  if (!z.uuid().safeParse(unitId).success) return null;
  const scope = scopeFor(user);
  const found = await getUnit(scope, unitId);
  if (!found) return null;
  const rows = await listCurrentReportsForUnit(scope, unitId);
  const captures = rows.flatMap((r) => {
    const parsed = analysisReportSchema.safeParse(r.report);
    return parsed.success ? [{ ...r, report: parsed.data }] : [];
  });
  return {
    serial: found.unit.serial, modelCode: found.rating.modelCode, ratingTitle: found.rating.title, owner: found.owner,
    disposition: found.unit.disposition, nameplate: (found.rating.nameplate ?? {}) as Record<string, unknown>,
    generatedAt: new Date(), captures,
  };
}
