import { eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { clientAdmins, labClients, organisations, planSteps, ratings, stations, toleranceProfiles, units, users } from "@/db/schema";
import { demoOrganisations, demoRatings, demoStations, demoUnits, demoUsers, secondLab } from "@/db/seed-data";
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
    // Each client's first user manages its API tokens (a lab manager can grant it to others).
    const clientAdminIds = [...new Map(userRows.filter((u) => u.role === "manufacturer").map((u) => [u.organisationId, u.id])).values()];
    if (clientAdminIds.length > 0) await tx.insert(clientAdmins).values(clientAdminIds.map((userId) => ({ userId, grantedById: manager?.id ?? null })));
    await tx.insert(stations).values(demoStations.map((s) => ({ ...s, labId })));
    for (const r of demoRatings) {
      const [rating] = await tx.insert(ratings).values({ organisationId: orgId(r.org), labId, modelCode: r.modelCode, title: r.title, nameplate: r.nameplate }).returning();
      if (!rating) throw new Error(`seed: rating ${r.modelCode} not stored`);
      await tx.insert(toleranceProfiles).values({ ratingId: rating.id, version: 1, profile: profileFromPreset(r.preset, r.nameplate), reason: "Started from a preset", createdById: manager?.id ?? null });
      await tx.insert(planSteps).values(r.plan.map((step, position) => ({
        ratingId: rating.id, position, name: step.name, testKind: step.testKind, ...speedWindow(step.speedRpm, step.windowPercent), requiredRoles: step.roles, checks: step.checks,
      })));
    }
    const ratingRows = await tx.select().from(ratings).where(eq(ratings.labId, labId));
    await tx.insert(units).values(
      demoUnits.map((u) => {
        const rating = ratingRows.find((r) => r.modelCode === u.modelCode);
        if (!rating) throw new Error(`seed: no rating ${u.modelCode}`);
        return { serial: u.serial, ratingId: rating.id, organisationId: rating.organisationId, labId, createdById: manager?.id ?? null };
      }),
    );
    await insertSecondLab(tx, orgId, passwordHash);
    return true;
  });
}

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

/** The second lab of the scenario (db/seed-data.ts, secondLab): people, bench, a shared client, units. */
async function insertSecondLab(tx: Tx, orgId: (slug: string) => string, passwordHash: string): Promise<void> {
  const [lab] = await tx.insert(organisations).values({ ...secondLab.organisation }).returning();
  if (!lab) throw new Error("seed: second lab not stored");
  await tx.insert(labClients).values(secondLab.clients.map((slug) => ({ labId: lab.id, clientId: orgId(slug) })));
  const people = await tx.insert(users).values(secondLab.users.map((u) => ({ ...u, organisationId: lab.id, passwordHash }))).returning();
  const manager = people.find((u) => u.role === "admin");
  await tx.insert(stations).values(secondLab.stations.map((st) => ({ ...st, labId: lab.id })));
  const template = demoRatings.find((r) => r.modelCode === secondLab.rating.basedOn);
  if (!template) throw new Error(`seed: no rating ${secondLab.rating.basedOn} to start the second lab's from`);
  const [rating] = await tx.insert(ratings).values({
    organisationId: orgId(secondLab.rating.org), labId: lab.id, modelCode: secondLab.rating.modelCode, title: template.title, nameplate: template.nameplate,
  }).returning();
  if (!rating) throw new Error("seed: second lab's rating not stored");
  await tx.insert(toleranceProfiles).values({ ratingId: rating.id, version: 1, profile: profileFromPreset(template.preset, template.nameplate), reason: "Started from a preset", createdById: manager?.id ?? null });
  await tx.insert(planSteps).values(template.plan.map((step, position) => ({
    ratingId: rating.id, position, name: step.name, testKind: step.testKind, ...speedWindow(step.speedRpm, step.windowPercent), requiredRoles: step.roles, checks: step.checks,
  })));
  await tx.insert(units).values(secondLab.units.map((serial) => ({ serial, ratingId: rating.id, organisationId: rating.organisationId, labId: lab.id, createdById: manager?.id ?? null })));
}
