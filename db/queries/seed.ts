import { eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { clientAdmins, instruments, labClients, organisations, planSteps, ratings, stationInstruments, stations, toleranceProfiles, units, users } from "@/db/schema";
import { demoInstruments, demoOrganisations, demoRatings, demoStations, demoUnits, demoUsers, secondLab } from "@/db/seed-data";
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
    const stationRows = await tx.insert(stations).values(demoStations.map((s) => ({ ...s, labId }))).returning();
    await insertDemoInstruments(tx, labId, manager?.id ?? null, stationRows.map((s) => s.id));
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

const dayFromToday = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

/** The instrument register (db/seed-data.ts, demoInstruments), dated from today, and the benches' default sets. */
async function insertDemoInstruments(tx: Tx, labId: string, createdById: string | null, stationIds: string[]): Promise<void> {
  for (const d of demoInstruments) {
    const [row] = await tx.insert(instruments).values({
      labId, kind: d.kind, make: d.make, model: d.model, serial: d.serial, assetTag: d.assetTag, spec: { ...d.spec },
      calibratedOn: dayFromToday(-d.calibratedDaysAgo), calibrationDue: dayFromToday(d.dueInDays),
      calibrationNote: `Certificate ${d.assetTag}-${2026 - (d.calibratedDaysAgo > 365 ? 1 : 0)} (invented calibration house)`, createdById,
    }).returning();
    if (!row) throw new Error(`seed: instrument ${d.assetTag} not stored`);
    const sets = (d.benches as readonly number[]).map((i) => stationIds[i]).filter((id): id is string => Boolean(id));
    if (sets.length > 0) await tx.insert(stationInstruments).values(sets.map((stationId) => ({ stationId, instrumentId: row.id, channel: "" })));
  }
}

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
