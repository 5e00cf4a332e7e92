import { afterAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { closeDb } from "@/db/queries/connection";
import { countUnitsByOverall, getUnit, getUnitBySerial, listUnits } from "@/db/queries/units";
import { demoUnits, secondLab as secondLabSeed } from "@/db/seed-data";

const secondLab_units: readonly string[] = secondLabSeed.units;
import { seededOrgs } from "./helpers";

afterAll(closeDb);

describe("unit queries under a Scope", () => {
  it("listUnits gives the lab every unit it tests and each client only its own, from the labs it is linked to", async () => {
    const { lab, secondLab, kestrum, poldane } = await seededOrgs();
    const first = await listUnits({ kind: "lab", labId: lab.id }, { limit: 500 });
    const second = await listUnits({ kind: "lab", labId: secondLab.id }, { limit: 500 });
    const all = [...first, ...second];
    expect(first.length).toBeGreaterThanOrEqual(demoUnits.length);
    expect(second.map((u) => u.serial)).toEqual(expect.arrayContaining([...secondLab_units]));
    expect(first.some((u) => secondLab_units.includes(u.serial))).toBe(false);
    const k = await listUnits({ kind: "manufacturer", organisationId: kestrum.id }, { limit: 500 });
    const p = await listUnits({ kind: "manufacturer", organisationId: poldane.id }, { limit: 500 });
    expect(k.every((u) => u.owner === "Kestrum Generators")).toBe(true);
    expect(p.every((u) => u.owner === "Poldane Motion Works")).toBe(true);
    // Other tests add clients of their own to the lab; the two demo clients' units are all the lab's units of theirs.
    expect(k.length + p.length).toBe(all.filter((u) => u.owner === "Kestrum Generators" || u.owner === "Poldane Motion Works").length);
  });

  it("getUnit and getUnitBySerial return nothing for another organisation's unit", async () => {
    const { kestrum, poldane } = await seededOrgs();
    const [poldaneUnit] = await listUnits({ kind: "manufacturer", organisationId: poldane.id }, { limit: 1 });
    expect(poldaneUnit).toBeDefined();
    const asKestrum = { kind: "manufacturer", organisationId: kestrum.id } as const;
    expect(await getUnit(asKestrum, poldaneUnit!.id)).toBeUndefined();
    expect(await getUnitBySerial(asKestrum, poldaneUnit!.serial)).toBeUndefined();
    expect((await getUnit({ kind: "manufacturer", organisationId: poldane.id }, poldaneUnit!.id))?.unit.serial).toBe(poldaneUnit!.serial);
  });

  it("a lab scope of another lab sees nothing", async () => {
    const { kestrum } = await seededOrgs();
    // A manufacturer's id used as a lab id matches no unit's lab.
    const counts = await countUnitsByOverall({ kind: "lab", labId: kestrum.id });
    expect(counts.total).toBe(0);
  });

  it("listUnits pages through the lab's units newest first without gaps or overlaps, each with its own capture count", async () => {
    const { lab } = await seededOrgs();
    const scope = { kind: "lab", labId: lab.id } as const;
    const whole = await listUnits(scope, { limit: 500 });
    expect(whole.length).toBeGreaterThan(14);
    const paged = [];
    for (let offset = 0; offset < whole.length; offset += 7) paged.push(...(await listUnits(scope, { limit: 7, offset })));
    expect(paged.map((u) => u.id)).toEqual(whole.map((u) => u.id));
    // The order, computed here from the rows themselves: latest capture (else registration) newest first, then serial.
    const facts = await getDb().execute<{ id: string; at: string; serial: string; n: string }>(sql`
      select u.id, extract(epoch from coalesce(u.latest_capture_at, u.created_at))::text as at, u.serial,
             (select count(*) from captures c where c.unit_id = u.id)::text as n
      from units u where u.lab_id = ${lab.id} and u.retired_at is null`);
    const byId = new Map(facts.rows.map((r) => [r.id, r]));
    expect(byId.size).toBe(whole.length);
    for (let i = 1; i < whole.length; i++) {
      const [a, b] = [byId.get(whole[i - 1]!.id)!, byId.get(whole[i]!.id)!];
      expect(Number(a.at) > Number(b.at) || (a.at === b.at && a.serial <= b.serial), `${a.serial} before ${b.serial}`).toBe(true);
    }
    expect(whole.map((u) => u.captureCount)).toEqual(whole.map((u) => Number(byId.get(u.id)!.n)));
    expect(whole.some((u) => u.captureCount > 0)).toBe(true);
  });

  it("listUnits filters by serial text without treating % as a wildcard", async () => {
    const { lab } = await seededOrgs();
    const scope = { kind: "lab", labId: lab.id } as const;
    expect((await listUnits(scope, { search: "PX120" })).length).toBeGreaterThan(0);
    expect(await listUnits(scope, { search: "%" })).toHaveLength(0);
  });
});
