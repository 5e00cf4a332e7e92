import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { labClients, organisations, planSteps, ratings, stations, toleranceProfiles, units, users } from "@/db/schema";
import { demoOrganisations, demoRatings, demoStations, demoUnits, demoUsers } from "@/db/seed-data";
import { profileFromPreset, speedWindow } from "@/lib/analysis";

/** Inserts the demo scenario once; a second run changes nothing. Returns false when it was already there. */
export async function insertDemoScenario(passwordHash: string): Promise<boolean> {
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
    await tx.insert(labClients).values(orgRows.filter((o) => o.kind === "manufacturer").map((o) => ({ labId, clientId: o.id })));
    const userRows = await tx.insert(users).values(demoUsers.map((u) => ({ email: u.email, name: u.name, role: u.role, organisationId: orgId(u.org), passwordHash }))).returning();
    const manager = userRows.find((u) => u.role === "admin");
    await tx.insert(stations).values(demoStations.map((s) => ({ ...s, labId })));
    for (const r of demoRatings) {
      const [rating] = await tx.insert(ratings).values({ organisationId: orgId(r.org), labId, modelCode: r.modelCode, title: r.title, nameplate: r.nameplate }).returning();
      if (!rating) throw new Error(`seed: rating ${r.modelCode} not stored`);
      await tx.insert(toleranceProfiles).values({ ratingId: rating.id, version: 1, profile: profileFromPreset(r.preset, r.nameplate), reason: "Started from a preset", createdById: manager?.id ?? null });
      await tx.insert(planSteps).values(r.plan.map((step, position) => ({
        ratingId: rating.id, position, name: step.name, testKind: step.testKind, ...speedWindow(step.speedRpm, step.windowPercent), requiredRoles: step.roles, checks: step.checks,
      })));
    }
    const ratingRows = await tx.select().from(ratings);
    await tx.insert(units).values(
      demoUnits.map((u) => {
        const rating = ratingRows.find((r) => r.modelCode === u.modelCode);
        if (!rating) throw new Error(`seed: no rating ${u.modelCode}`);
        return { serial: u.serial, ratingId: rating.id, organisationId: rating.organisationId, labId, createdById: manager?.id ?? null };
      }),
    );
    return true;
  });
}
