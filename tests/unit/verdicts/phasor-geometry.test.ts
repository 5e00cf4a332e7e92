import { describe, expect, it } from "vitest";
import { magnificationFor, phasorSet, tipOf, type PhasorReport } from "@/components/phasors/phasor-geometry";
import { reference } from "../analysis/fixtures";

const deg = (re: number, im: number) => (Math.atan2(im, re) * 180) / Math.PI;

/** A stored report's phasor part from the numpy fixture's phasors (peak amplitudes), turned by `offsetDeg`. */
function reportFromFixture(offsetDeg: number, roles: [string, string, string] = ["van", "vbn", "vcn"]): PhasorReport {
  const channels = reference.threePhase.phasors.map((p, i) => ({
    id: `ch${i + 1}`, role: roles[i] as string, fundamental: { rms: Math.hypot(p.re, p.im) / Math.SQRT2, phaseDeg: deg(p.re, p.im) + offsetDeg },
  }));
  return { channels, threePhase: { basis: "line-neutral", sequence: "positive", sequenceComponents: { positive: 0, negative: 0, zero: 0 } } };
}

describe("phasorSet(report)", () => {
  it("refers angles to phase A and keeps each RMS length (numpy fixture, scripts/fixtures/make_analysis_fixtures.py)", () => {
    const set = phasorSet(reportFromFixture(37));
    expect(set).not.toBeNull();
    const [a, b, c] = set!.phases;
    const [pa, pb, pc] = reference.threePhase.phasors as [{ re: number; im: number }, { re: number; im: number }, { re: number; im: number }];
    expect(a.angleDeg).toBeCloseTo(0, 9);
    // The fixture's displacements A−B = 118.7°, C−A = 121.4° (numpy fixture).
    expect(b.angleDeg).toBeCloseTo(-reference.threePhase.displacementDeg[0]!, 9);
    expect(c.angleDeg).toBeCloseTo(reference.threePhase.displacementDeg[2]!, 9);
    expect(a.rms).toBeCloseTo(Math.hypot(pa.re, pa.im) / Math.SQRT2, 9);
    expect(b.rms).toBeCloseTo(Math.hypot(pb.re, pb.im) / Math.SQRT2, 9);
    expect(c.rms).toBeCloseTo(Math.hypot(pc.re, pc.im) / Math.SQRT2, 9);
    expect([a.name, b.name, c.name]).toEqual(["A–N", "B–N", "C–N"]);
  });

  it("gives the negative-sequence component and V2/V1 of numpy's Fortescue transform (numpy fixture)", () => {
    const set = phasorSet(reportFromFixture(-80))!;
    expect(set.negative.rms).toBeCloseTo(reference.threePhase.negative / Math.SQRT2, 9);
    expect(set.positive.rms).toBeCloseTo(reference.threePhase.positive / Math.SQRT2, 9);
    expect(set.zero.rms).toBeCloseTo(reference.threePhase.zero / Math.SQRT2, 9);
    expect(set.negativePercent).toBeCloseTo(reference.threePhase.vufPercent, 9);
  });

  it("gives V1 = 2/3 ∠0° and V2 = 1/3 ∠60° when phase C is lost (hand calculation, Fortescue)", () => {
    // Va = 1∠0°, Vb = 1∠−120°, Vc = 0: V1 = (Va + a·Vb)/3 = 2/3 ∠0°, V2 = (Va + a²·Vb)/3 = 1/3 ∠60°.
    const set = phasorSet({
      channels: [
        { id: "a", role: "van", fundamental: { rms: 1, phaseDeg: 10 } },
        { id: "b", role: "vbn", fundamental: { rms: 1, phaseDeg: -110 } },
        { id: "c", role: "vcn", fundamental: { rms: 0, phaseDeg: 0 } },
      ],
      threePhase: { basis: "line-neutral", sequence: "positive", sequenceComponents: { positive: 0, negative: 0, zero: 0 } },
    })!;
    expect(set.positive.rms).toBeCloseTo(2 / 3, 12);
    expect(set.positive.angleDeg).toBeCloseTo(0, 9);
    expect(set.negative.rms).toBeCloseTo(1 / 3, 12);
    expect(set.negative.angleDeg).toBeCloseTo(60, 9);
    expect(set.negativePercent).toBeCloseTo(50, 9);
  });

  it("uses the line-line channels on a line-line basis and is null without a full set", () => {
    const lineLine = { ...reportFromFixture(0, ["vab", "vbc", "vca"]), threePhase: { basis: "line-line" as const, sequence: "positive" as const, sequenceComponents: { positive: 0, negative: 0, zero: 0 } } };
    expect(phasorSet(lineLine)?.phases.map((p) => p.name)).toEqual(["A–B", "B–C", "C–A"]);
    expect(phasorSet({ ...reportFromFixture(0), threePhase: null })).toBeNull();
    expect(phasorSet(reportFromFixture(0, ["van", "vbn", "v"]))).toBeNull();
  });
});

describe("tipOf(phasor, fullScale, radius)", () => {
  it("draws counter-clockwise with SVG's downward y and scales the length to the radius (common practice)", () => {
    const up = tipOf({ rms: 100, angleDeg: 90 }, 200, 120);
    expect(up.x).toBeCloseTo(0, 12);
    expect(up.y).toBeCloseTo(-60, 12);
    const lagging = tipOf({ rms: 230, angleDeg: -120 }, 230, 120);
    expect(lagging.x).toBeCloseTo(-60, 12);
    expect(lagging.y).toBeCloseTo(120 * Math.sin(Math.PI / 3), 12);
    expect(Object.is(tipOf({ rms: 0, angleDeg: 0 }, 230, 120).y, -0)).toBe(false);
  });
});

describe("magnificationFor(rms, fullScale)", () => {
  it("picks the largest 1-2-5 factor up to 100 that keeps the drawn phasor within 40 % of full scale", () => {
    expect(magnificationFor(2.87, 231)).toBe(20);
    expect(magnificationFor(0.0001, 231)).toBe(100);
    expect(magnificationFor(120, 231)).toBe(1);
    expect(magnificationFor(0, 231)).toBe(1);
  });
});
