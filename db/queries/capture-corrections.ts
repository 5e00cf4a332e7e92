import { and, desc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { captureCorrections, captures, planSteps, units, users, type Capture } from "@/db/schema";
import { captureScopeWhere } from "./captures";
import { unitScopeWhere, type Scope } from "./scope";

export type CaptureSettings = Pick<Capture, "channelRoles" | "probeScales" | "channelOffsets" | "speedRpm" | "testKind" | "planStepId" | "magnetTemperatureC">;

/**
 * Applies new settings to a finished capture, records who, when, why and what changed, and puts it back
 * in the queue, in one transaction. "busy" while it is still being uploaded or analysed.
 */
export async function applyCaptureCorrection(
  scope: Scope,
  captureId: string,
  change: Partial<CaptureSettings>,
  by: { actorId: string | null; stationKeyId: string | null; reason: string },
): Promise<"corrected" | "unchanged" | "busy" | "missing"> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx.select().from(captures).where(and(eq(captures.id, captureId), captureScopeWhere(scope))).for("update");
    if (!row) return "missing";
    if (!["analysed", "rejected", "failed"].includes(row.state)) return "busy";
    const before: Record<string, unknown> = {};
    const after: Record<string, unknown> = {};
    for (const [key, value] of Object.entries(change) as [keyof CaptureSettings, unknown][]) {
      if (value === undefined || JSON.stringify(row[key]) === JSON.stringify(value)) continue;
      before[key] = row[key];
      after[key] = value;
    }
    if (Object.keys(after).length === 0) return "unchanged";
    await tx.update(captures).set({ ...(after as Partial<CaptureSettings>), state: "queued", progress: 0, stateMessage: "Settings corrected: analysing again", updatedAt: new Date() }).where(eq(captures.id, row.id));
    await tx.insert(captureCorrections).values({ captureId: row.id, actorId: by.actorId, stationKeyId: by.stationKeyId, reason: by.reason, before, after });
    return "corrected";
  });
}

export async function listCaptureCorrections(scope: Scope, captureId: string) {
  return getDb()
    .select({ id: captureCorrections.id, reason: captureCorrections.reason, before: captureCorrections.before, after: captureCorrections.after, createdAt: captureCorrections.createdAt, actor: users.name })
    .from(captureCorrections)
    .innerJoin(captures, eq(captures.id, captureCorrections.captureId))
    .innerJoin(units, eq(units.id, captures.unitId))
    .leftJoin(users, eq(users.id, captureCorrections.actorId))
    .where(and(eq(captureCorrections.captureId, captureId), unitScopeWhere(scope)))
    .orderBy(desc(captureCorrections.createdAt))
    .limit(100);
}

/** Whether a plan step belongs to the capture's rating and is in force (a correction may only pick such a step). */
export async function planStepFitsCapture(scope: Scope, captureId: string, stepIds: string[]): Promise<boolean> {
  if (stepIds.length === 0) return true;
  const rows = await getDb()
    .select({ id: planSteps.id })
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(planSteps, eq(planSteps.ratingId, units.ratingId))
    .where(and(eq(captures.id, captureId), inArray(planSteps.id, stepIds), unitScopeWhere(scope)));
  return rows.length === stepIds.length;
}
