import { describe, expect, it } from "vitest";
import { buildOpenApiDocument } from "@/lib/captures/openapi";
import { profileFromPreset } from "@/lib/analysis";
import { describeNameplate } from "@/lib/ratings/describe";
import { unflattenForm } from "@/lib/ratings/form-data";
import { planStepInputSchema } from "@/lib/ratings/input-schemas";
import { diffProfiles } from "@/lib/ratings/profile-diff";

const alternator = {
  machineKind: "wound-field-alternator", phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1500, nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, ratedKva: 45,
} as const;

describe("describeNameplate(nameplate)", () => {
  it("gives labelled rows with units and no raw keys", () => {
    const rows = describeNameplate({ ...alternator, machineKind: "pm-generator", ke: { value: 267, basis: "line-line-rms-per-krpm" }, magnetMaterial: "ndfeb", magnetReferenceC: 20 });
    expect(rows).toContainEqual({ label: "Rated voltage", value: "400 V, line-to-line, RMS" });
    expect(rows).toContainEqual({ label: "Rated speed", value: "1 500 rpm" });
    expect(rows).toContainEqual({ label: "Nominal Ke", value: "267 V/krpm, V (line-to-line RMS) per 1000 rpm" });
    expect(rows).toContainEqual({ label: "Magnet material", value: "NdFeB" });
    expect(rows.map((r) => r.value).join(" ")).not.toMatch(/line-line-rms|pm-generator|ndfeb/);
  });
});

describe("diffProfiles(before, after)", () => {
  it("names each changed band in words and nothing else", () => {
    const a = profileFromPreset("iec-60034-1", alternator);
    const b = { ...a, marginalZonePercent: 20, checks: { ...a.checks, thd: { ...a.checks.thd, maxPercent: 3 } } };
    expect(diffProfiles(a, b)).toEqual(["Marginal zone: 10 % → 20 %", "Total harmonic distortion (THD): at most 5 % → at most 3 %"]);
    expect(diffProfiles(a, a)).toEqual([]);
  });
});

describe("unflattenForm(entries)", () => {
  it("nests dotted names, reads numbers and booleans, leaves empty fields out and collects lists", () => {
    const f = new FormData();
    for (const [k, v] of [["nameplate.poles", "4"], ["nameplate.ke.value", ""], ["profile.checks.thd.required", "true"], ["checks", "voltage"], ["checks", "thd"], ["nameplate.ratedKva", "4x"]]) f.append(k as string, v as string);
    expect(unflattenForm(f.entries())).toEqual({ nameplate: { poles: 4, ratedKva: "4x" }, profile: { checks: { thd: { required: true } } }, checks: ["voltage", "thd"] });
  });
});

describe("planStepInputSchema", () => {
  it("turns speed ± % into a window (1500 rpm ± 2 % = 1470 … 1530 rpm, arithmetic) and refuses an empty one by field", () => {
    const ok = planStepInputSchema.parse({ name: "No-load", testKind: "no-load", speedRpm: 1500, speedTolerancePercent: 2, checks: ["voltage"] });
    expect(ok.speedMinRpm).toBeCloseTo(1470, 9);
    expect(ok.speedMaxRpm).toBeCloseTo(1530, 9);
    const bad = planStepInputSchema.safeParse({ name: "No-load", testKind: "no-load", speedMinRpm: 1600, speedMaxRpm: 1500, checks: ["voltage"] });
    expect(bad.error?.issues[0]?.path).toEqual(["speedMaxRpm"]);
  });
});

describe("buildOpenApiDocument(url)", () => {
  it("documents the ratings routes with both lab auth schemes, and the client token scheme of the reports routes", () => {
    const doc = buildOpenApiDocument("http://x");
    for (const path of ["/api/v1/ratings", "/api/v1/ratings/{id}", "/api/v1/ratings/{id}/retire", "/api/v1/ratings/{id}/profile", "/api/v1/ratings/{id}/plan"]) expect(doc.paths, path).toHaveProperty([path]);
    expect(Object.keys(doc.components.securitySchemes)).toEqual(["stationKey", "session", "clientToken"]);
    for (const path of ["/api/v1/reports", "/api/v1/reports/{number}/pdf"]) expect(doc.paths, path).toHaveProperty([path]);
    expect(doc.components.schemas).toHaveProperty("RatingCreate");
  });
});
