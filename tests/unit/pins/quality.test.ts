import { describe, expect, it } from "vitest";
import { clippingWarning, dcOffsetWarning, flatTopRunSamples, polePairWarning } from "@/lib/analysis/quality";
import { levelWarning, likelyCause, roleWarning } from "@/lib/analysis/plausibility";
import { nextDown, nextUp } from "./steps";

describe("quality thresholds (pins, common practice as the sources say)", () => {
  it("flatTopRunSamples is ⌈2 % of a cycle⌉, at least 4: 1000 → 20, 1001 → 21, 250 → 5, 100 → 4", () => {
    expect([flatTopRunSamples(1000), flatTopRunSamples(1001), flatTopRunSamples(250), flatTopRunSamples(100)]).toEqual([20, 21, 5, 4]);
  });

  it("clippingWarning needs two flat tops: 2 warn, 1 does not", () => {
    expect(clippingWarning("a", 2, 9)).not.toBeNull();
    expect(clippingWarning("a", 1, 9)).toBeNull();
  });

  it("dcOffsetWarning warns above 2 % of the peak, either sign; exactly 2 % does not", () => {
    expect(dcOffsetWarning("a", 2, 100)).toBeNull();
    expect(dcOffsetWarning("a", -2, 100)).toBeNull();
    expect(dcOffsetWarning("a", nextUp(2), 100)).not.toBeNull();
    expect(dcOffsetWarning("a", -nextUp(2), 100)).not.toBeNull();
  });

  it("polePairWarning allows 2 % of the nearest even count, edge included: 49 → 50 ± 1 passes, one step lower warns; 3.99 → 4", () => {
    expect(polePairWarning(49)).toBeNull();
    expect(polePairWarning(nextDown(49))).not.toBeNull();
    expect(polePairWarning(3.99)).toBeNull();
    expect(polePairWarning(4.1)).not.toBeNull();
  });
});

describe("plausibility edges (pins)", () => {
  it("levelWarning flags a level factor× or more off either way, exactly the factor included (100 against 300 V is 1/3 exactly)", () => {
    expect(levelWarning("implausible-voltage", "Voltage", 1200, 400, "V", 3)).not.toBeNull();
    expect(levelWarning("implausible-voltage", "Voltage", nextDown(1200), 400, "V", 3)).toBeNull();
    expect(levelWarning("implausible-voltage", "Voltage", 100, 300, "V", 3)).not.toBeNull();
    expect(levelWarning("implausible-voltage", "Voltage", nextUp(100), 300, "V", 3)).toBeNull();
  });

  it("likelyCause names a decade within ±25 %, edges included: 12.5 and 7.5 read ×10 high, 13 does not", () => {
    expect(likelyCause(12.5)).toContain("×10 high");
    expect(likelyCause(7.5)).toContain("×10 high");
    expect(likelyCause(13)).not.toContain("×10");
  });

  it("roleWarning flags two phase-set roles on a single-phase rating, not one", () => {
    const v = (id: string, role: "van" | "vbn" | "v") => ({ id, role, unit: "V" as const });
    expect(roleWarning([v("a", "van"), v("b", "vbn")], { phases: 1 }, false)).not.toBeNull();
    expect(roleWarning([v("a", "van"), v("b", "v")], { phases: 1 }, false)).toBeNull();
  });
});

describe("levelWarning sign (pins)", () => {
  it("levelWarning compares magnitudes: −400 V against 400 V rated is plausible (an inverted probe is not a ratio error)", () => {
    expect(levelWarning("implausible-voltage", "Voltage", -400, 400, "V", 3)).toBeNull();
  });
});
