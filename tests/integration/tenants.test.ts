import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { closeDb } from "@/db/queries/connection";
import { getRatingForRegistration, getUnit, listRatingsForRegistration, listUnits } from "@/db/queries/units";
import { listOrganisationsForLab, listUsersForAdmin } from "@/db/queries/users";
import { ratings, units } from "@/db/schema";
import { seededOrgs } from "./helpers";

afterAll(closeDb);

describe("tenant isolation between two labs sharing one client", () => {
  it("listOrganisationsForLab offers a lab manager their own lab and their own clients only", async () => {
    const { lab, secondLab, kestrum, poldane } = await seededOrgs();
    // Other test files add clients of their own to the demo lab: the seeded ones must be there, and no other lab's.
    const own = (await listOrganisationsForLab(lab.id)).map((o) => o.id);
    expect(own).toEqual(expect.arrayContaining([lab.id, kestrum.id, poldane.id]));
    expect(own).not.toContain(secondLab.id);
    const second = (await listOrganisationsForLab(secondLab.id)).map((o) => o.id);
    expect(second).toEqual(expect.arrayContaining([secondLab.id, kestrum.id]));
    expect(second).not.toContain(lab.id);
    expect(second).not.toContain(poldane.id);
  });

  it("listUsersForAdmin gives each lab its own staff and its own clients' users, never the other lab's", async () => {
    const { lab, secondLab } = await seededOrgs();
    const first = (await listUsersForAdmin(lab.id)).map((u) => u.email);
    const second = (await listUsersForAdmin(secondLab.id)).map((u) => u.email);
    expect(first).toContain("ruan.petit@kestrum.example");
    expect(second).toContain("ruan.petit@kestrum.example");
    expect(second).not.toContain("sela.ambrose@poldane.example");
    expect(first.some((e) => e.endsWith("@calderwick.example"))).toBe(false);
    expect(second.some((e) => e.endsWith("@harrowgate.example"))).toBe(false);
  });

  it("listRatingsForRegistration and getRatingForRegistration give a lab only its own ratings of its own clients", async () => {
    const { lab, secondLab } = await seededOrgs();
    const mine = await listRatingsForRegistration({ kind: "lab", labId: secondLab.id });
    expect(mine.map((r) => r.owner)).toEqual(["Kestrum Generators"]);
    const firstLabRating = (await getDb().select().from(ratings).where(eq(ratings.labId, lab.id)).limit(1))[0]!;
    expect(await getRatingForRegistration({ kind: "lab", labId: secondLab.id }, firstLabRating.id)).toBeUndefined();
    expect((await getRatingForRegistration({ kind: "lab", labId: lab.id }, firstLabRating.id))?.id).toBe(firstLabRating.id);
  });

  it("unitScopeWhere shows a client the units of linked labs only (a stray unit of an unlinked lab stays hidden)", async () => {
    const { secondLab, kestrum, poldane } = await seededOrgs();
    const poldaneRating = (await getDb().select().from(ratings).where(eq(ratings.organisationId, poldane.id)).limit(1))[0]!;
    const [stray] = await getDb().insert(units)
      .values({ serial: `STRAY-${randomUUID().slice(0, 8)}`, ratingId: poldaneRating.id, organisationId: poldane.id, labId: secondLab.id }).returning();
    const asPoldane = { kind: "manufacturer", organisationId: poldane.id } as const;
    expect(await getUnit(asPoldane, stray!.id)).toBeUndefined();
    expect((await listUnits(asPoldane, { limit: 500 })).some((u) => u.id === stray!.id)).toBe(false);
    const kestrumSees = await listUnits({ kind: "manufacturer", organisationId: kestrum.id }, { limit: 500 });
    expect(kestrumSees.some((u) => u.serial.startsWith("KG45-CW"))).toBe(true);
    await getDb().delete(units).where(and(eq(units.id, stray!.id)));
  });
});
