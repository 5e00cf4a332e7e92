import { describe, expect, it } from "vitest";
import { describeExceedance, describeLimit, exceedanceOf, findingsOf } from "@/lib/units/check-exceedance";
import { clientVisibleNotes } from "@/lib/units/client-notes";

// Exceedance is plain arithmetic (common practice): measured − upper above a band, lower − measured below it.
describe("exceedanceOf", () => {
  it("exceedanceOf gives the distance beyond the violated edge and its share of that edge", () => {
    // THD 5.4 % against at most 5 %: 0.4 % over, 8 % of the limit (hand arithmetic).
    const above = exceedanceOf({ measured: 5.4, lower: null, upper: 5 });
    expect(above?.side).toBe("above");
    expect(above?.amount).toBeCloseTo(0.4, 12);
    expect(above?.percentOfLimit).toBeCloseTo(8, 10);
    // 376 V against 380 to 420 V: 4 V below, 1.0526 % of 380 V (hand arithmetic: 4/380).
    const below = exceedanceOf({ measured: 376, lower: 380, upper: 420 });
    expect(below?.side).toBe("below");
    expect(below?.amount).toBeCloseTo(4, 12);
    expect(below?.percentOfLimit).toBeCloseTo(1.0526315789, 8);
  });

  it("exceedanceOf is null inside the band and for a missing or textual figure", () => {
    expect(exceedanceOf({ measured: 400, lower: 380, upper: 420 })).toBeNull();
    expect(exceedanceOf({ measured: null, lower: 380, upper: 420 })).toBeNull();
    expect(exceedanceOf({ measured: "ACB", lower: null, upper: null })).toBeNull();
  });
});

describe("findingsOf", () => {
  it("findingsOf keeps only failing and inconclusive checks with measured value, limit and exceedance", () => {
    const findings = findingsOf([
      { check: "thd", label: "THD", measured: 5.4, unit: "%", lower: null, upper: 5, status: "fail" },
      { check: "frequency", label: "Frequency", measured: 50.01, unit: "Hz", lower: 49.5, upper: 50.5, status: "pass" },
      { check: "tif", label: "TIF", measured: null, unit: "", lower: null, upper: 50, status: "inconclusive", reason: "the figure could not be computed from this capture" },
    ]);
    expect(findings.map((f) => f.check)).toEqual(["thd", "tif"]);
    expect(findings[0]).toMatchObject({ measured: "5.4 %", limit: "at most 5 %" });
    expect(describeExceedance(findings[0]!.exceedance!, "%")).toBe("0.4 % above the limit (8 % of the limit)");
    expect(findings[1]).toMatchObject({ measured: "not measured", exceedance: null, reason: expect.stringMatching(/could not be computed/) });
    expect(describeLimit({ lower: 380, upper: 420, unit: "V" })).toBe("380 to 420 V");
  });
});

describe("clientVisibleNotes", () => {
  it("clientVisibleNotes drops internal notes and every author", () => {
    const at = new Date("2026-03-01T10:00:00Z");
    const out = clientVisibleNotes([
      { visibility: "internal", body: "rotor looked scuffed", createdAt: at, author: "Ines Vardy" },
      { visibility: "client", body: "Retest booked for Monday", createdAt: at, author: "Ines Vardy" },
    ]);
    expect(out).toEqual([{ body: "Retest booked for Monday", createdAt: at }]);
  });
});
