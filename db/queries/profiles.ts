import { and, desc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { ratings, toleranceProfiles, users, type ToleranceProfileVersion } from "@/db/schema";
import type { ToleranceProfile } from "@/lib/analysis";
import type { Scope } from "./scope";

// Tolerance profile versions are only ever inserted: there is no update or delete here, and analyses
// point at the version they were judged with.

type LabScope = Scope & { kind: "lab" };

/** Every version of a lab's rating, newest first, with who saved it. */
export async function listProfileVersions(scope: LabScope, ratingId: string) {
  return getDb()
    .select({ version: toleranceProfiles, author: users.name })
    .from(toleranceProfiles)
    .innerJoin(ratings, eq(ratings.id, toleranceProfiles.ratingId))
    .leftJoin(users, eq(users.id, toleranceProfiles.createdById))
    .where(and(eq(ratings.id, ratingId), eq(ratings.labId, scope.labId)))
    .orderBy(desc(toleranceProfiles.version));
}

/** Appends the next version (highest + 1) of a lab's rating's profile; undefined when the rating is not the lab's. */
export async function insertProfileVersion(scope: LabScope, ratingId: string, values: { profile: ToleranceProfile; reason: string; userId: string | null }): Promise<ToleranceProfileVersion | undefined> {
  return getDb().transaction(async (tx) => {
    // Locks the rating row so two saves cannot take the same version number.
    const [rating] = await tx.select({ id: ratings.id }).from(ratings).where(and(eq(ratings.id, ratingId), eq(ratings.labId, scope.labId))).for("update");
    if (!rating) return undefined;
    const [top] = await tx.select({ v: sql<number>`coalesce(max(${toleranceProfiles.version}), 0)`.mapWith(Number) }).from(toleranceProfiles).where(eq(toleranceProfiles.ratingId, ratingId));
    const [row] = await tx.insert(toleranceProfiles).values({ ratingId, version: (top?.v ?? 0) + 1, profile: values.profile, reason: values.reason, createdById: values.userId }).returning();
    await tx.update(ratings).set({ updatedAt: new Date() }).where(eq(ratings.id, ratingId));
    return row;
  });
}
