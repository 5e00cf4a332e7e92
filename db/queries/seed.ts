import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { organisations, ratings, stations, units, users } from "@/db/schema";
import { demoOrganisations, demoRatings, demoStations, demoUnits, demoUsers } from "@/db/seed-data";

/** Inserts the demo scenario once; a second run changes nothing. Returns false when it was already there. */
export async function insertDemoScenario(passwordHash: string, toleranceFor: (nameplate: unknown) => unknown): Promise<boolean> {
  const db = getDb();
  return db.transaction(async (tx) => {
    const existing = await tx.select({ n: sql<number>`count(*)`.mapWith(Number) }).from(organisations);
    if ((existing[0]?.n ?? 0) > 0) return false;
    const orgRows = await tx.insert(organisations).values(demoOrganisations.map((o) => ({ ...o }))).returning();
    const orgId = (slug: string) => {
      const row = orgRows.find((o) => o.slug === slug);
      if (!row) throw new Error(`seed: no organisation ${slug}`);
      return row.id;
    };
    const labId = orgId("harrowgate-lab");
    await tx.insert(users).values(demoUsers.map((u) => ({ email: u.email, name: u.name, role: u.role, organisationId: orgId(u.org), passwordHash })));
    await tx.insert(stations).values(demoStations.map((s) => ({ ...s, labId })));
    const ratingRows = await tx
      .insert(ratings)
      .values(demoRatings.map((r) => ({ organisationId: orgId(r.org), modelCode: r.modelCode, title: r.title, nameplate: r.nameplate, tolerance: toleranceFor(r.nameplate) })))
      .returning();
    await tx.insert(units).values(
      demoUnits.map((u) => {
        const rating = ratingRows.find((r) => r.modelCode === u.modelCode);
        if (!rating) throw new Error(`seed: no rating ${u.modelCode}`);
        return { serial: u.serial, ratingId: rating.id, organisationId: rating.organisationId, labId };
      }),
    );
    return true;
  });
}
