import { and, asc, eq, isNotNull, isNull, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, labClients, organisations, ratings, toleranceProfiles, units, type Rating } from "@/db/schema";
import type { Rating as Nameplate, ToleranceProfile } from "@/lib/analysis";
import type { Scope } from "./scope";

// Ratings of a lab: every read and write is limited to rows whose lab_id is the scope's lab and whose
// client is linked to that lab.

type LabScope = Scope & { kind: "lab" };

export type RatingFilters = { clientId?: string; machineKind?: string; retired: "active" | "retired" | "all" };

const inLab = (scope: LabScope) => and(eq(ratings.labId, scope.labId), sql`exists (select 1 from ${labClients} where ${labClients.labId} = ${scope.labId} and ${labClients.clientId} = ${ratings.organisationId})`);

export async function listRatingsForLab(scope: LabScope, filters: RatingFilters) {
  const where: (SQL | undefined)[] = [inLab(scope)];
  if (filters.clientId) where.push(eq(ratings.organisationId, filters.clientId));
  if (filters.machineKind) where.push(sql`${ratings.nameplate}->>'machineKind' = ${filters.machineKind}`);
  if (filters.retired === "active") where.push(isNull(ratings.retiredAt));
  if (filters.retired === "retired") where.push(isNotNull(ratings.retiredAt));
  return getDb()
    .select({
      rating: ratings, client: organisations.name,
      units: sql<number>`(select count(*) from ${units} where ${units.ratingId} = ${ratings.id})`.mapWith(Number),
      profileVersion: sql<number | null>`(select max(${toleranceProfiles.version}) from ${toleranceProfiles} where ${toleranceProfiles.ratingId} = ${ratings.id})`,
    })
    .from(ratings)
    .innerJoin(organisations, eq(organisations.id, ratings.organisationId))
    .where(and(...where))
    .orderBy(asc(organisations.name), asc(ratings.modelCode))
    .limit(500);
}

export async function getRatingForLab(scope: LabScope, ratingId: string): Promise<{ rating: Rating; client: string } | undefined> {
  const rows = await getDb().select({ rating: ratings, client: organisations.name }).from(ratings)
    .innerJoin(organisations, eq(organisations.id, ratings.organisationId))
    .where(and(inLab(scope), eq(ratings.id, ratingId))).limit(1);
  return rows[0];
}

export async function modelCodeTaken(scope: LabScope, clientId: string, modelCode: string, exceptId?: string): Promise<boolean> {
  const rows = await getDb().select({ id: ratings.id }).from(ratings)
    .where(and(eq(ratings.labId, scope.labId), eq(ratings.organisationId, clientId), eq(sql`lower(${ratings.modelCode})`, modelCode.toLowerCase())));
  return rows.some((r) => r.id !== exceptId);
}

export const isUniqueViolation = (err: unknown) => {
  const e = err as { code?: string; cause?: { code?: string } };
  return e?.code === "23505" || e?.cause?.code === "23505";
};

/** The rating and its profile version 1, in one transaction. */
export async function insertRatingWithProfile(scope: LabScope, values: {
  clientId: string; modelCode: string; title: string; nameplate: Nameplate; profile: ToleranceProfile; reason: string; userId: string | null;
}): Promise<Rating> {
  return getDb().transaction(async (tx) => {
    const [rating] = await tx.insert(ratings).values({ organisationId: values.clientId, labId: scope.labId, modelCode: values.modelCode, title: values.title, nameplate: values.nameplate }).returning();
    if (!rating) throw new Error("rating not stored");
    await tx.insert(toleranceProfiles).values({ ratingId: rating.id, version: 1, profile: values.profile, reason: values.reason, createdById: values.userId });
    return rating;
  });
}

export async function updateRatingForLab(scope: LabScope, ratingId: string, values: { modelCode?: string; title?: string; nameplate?: Nameplate; retiredAt?: Date | null }) {
  const [row] = await getDb().update(ratings).set({ ...values, updatedAt: new Date() }).where(and(inLab(scope), eq(ratings.id, ratingId))).returning();
  return row;
}

/** Units of the rating in the lab (for plan refreshes). */
export async function listUnitIdsOfRating(scope: LabScope, ratingId: string): Promise<string[]> {
  const rows = await getDb().select({ id: units.id }).from(units).where(and(eq(units.labId, scope.labId), eq(units.ratingId, ratingId)));
  return rows.map((r) => r.id);
}

/** How many analysed captures of the rating's units a re-judge would look at. */
export async function countJudgedCapturesOfRating(scope: LabScope, ratingId: string): Promise<number> {
  const rows = await getDb().select({ n: sql<number>`count(*)`.mapWith(Number) }).from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .where(and(eq(units.labId, scope.labId), eq(units.ratingId, ratingId), eq(captures.state, "analysed")));
  return rows[0]?.n ?? 0;
}
