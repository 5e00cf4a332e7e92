import { and, asc, desc, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { planSteps, ratings, toleranceProfiles, type PlanStepRow, type Rating, type ToleranceProfileVersion } from "@/db/schema";

// What captures are judged against. Callers have already checked the rating is in their scope
// (through the unit or capture they hold); these take a rating id that came from such a row.

/** The profile version in force for a rating: the highest one. */
export async function getProfileInForce(ratingId: string): Promise<ToleranceProfileVersion | undefined> {
  const rows = await getDb().select().from(toleranceProfiles).where(eq(toleranceProfiles.ratingId, ratingId)).orderBy(desc(toleranceProfiles.version)).limit(1);
  return rows[0];
}

export async function getProfileVersion(profileVersionId: string): Promise<ToleranceProfileVersion | undefined> {
  const rows = await getDb().select().from(toleranceProfiles).where(eq(toleranceProfiles.id, profileVersionId)).limit(1);
  return rows[0];
}

/** The rating's plan in order, retired steps left out. */
export async function listActivePlanSteps(ratingId: string): Promise<PlanStepRow[]> {
  return getDb().select().from(planSteps).where(and(eq(planSteps.ratingId, ratingId), isNull(planSteps.retiredAt))).orderBy(asc(planSteps.position), asc(planSteps.createdAt));
}

/** A rating by id, for callers that took the id from a unit or capture row in their scope. */
export async function getRatingById(ratingId: string): Promise<Rating | undefined> {
  const rows = await getDb().select().from(ratings).where(eq(ratings.id, ratingId)).limit(1);
  return rows[0];
}
