import { describe, expect, it } from "vitest";
import { analyseCapture, computeMaxDeviationUnbalance, computeVuf, computeVufFromLineMagnitudes, symmetricalComponents } from "@/lib/analysis";
import { displacementDeg, wrapDeg } from "@/lib/analysis/phasors";
import { reference } from "./fixtures";
import { angleGapDeg, captureOf, relativeError, synthesise } from "./signals";

const PHASE_DEG = 0.05; // from the issue
const VUF_PP = 0.02; // from the issue

describe("computeMaxDeviationUnbalance", () => {
  it("computeMaxDeviationUnbalance([460, 467, 450]) matches the NEMA worked example 1.96 % (NEMA MG 1, DOMAIN §6)", () => {
    expect(computeMaxDeviationUnbalance([460, 467, 450])).toBeCloseTo(1.96, 2);
  });
  it("computeMaxDeviationUnbalance([462, 463, 455]) gives 1.09 % (NEMA MG 1 example, DOMAIN §6)", () => {
    expect(computeMaxDeviationUnbalance([462, 463, 455])).toBeCloseTo(1.09, 2);
  });
  it("computeMaxDeviationUnbalance([480, 476, 472]) gives 0.84 % (NEMA MG 1 example, DOMAIN §6)", () => {
    expect(computeMaxDeviationUnbalance([480, 476, 472])).toBeCloseTo(0.84, 2);
  });
  it("computeMaxDeviationUnbalance([]) is null (explicit not-computable)", () => {
    expect(computeMaxDeviationUnbalance([])).toBeNull();
  });
});

describe("computeVufFromLineMagnitudes", () => {
  it("computeVufFromLineMagnitudes(460, 467, 450) gives VUF 2.1465 % (derived check value, DOMAIN §6)", () => {
    expect(computeVufFromLineMagnitudes(460, 467, 450)).toBeCloseTo(2.1465, 4);
  });
  it("computeVufFromLineMagnitudes of the fixture's line voltages equals numpy's |V2|/|V1| (numpy fixture)", () => {
    const [a, b, c] = reference.threePhase.lineLineRms as [number, number, number];
    expect(computeVufFromLineMagnitudes(a, b, c)).toBeCloseTo(reference.threePhase.vufPercent, 9);
  });
});

describe("symmetricalComponents", () => {
  it("symmetricalComponents(fixture phasors) equals numpy's Fortescue transform (numpy fixture)", () => {
    const [a, b, c] = reference.threePhase.phasors as [{ re: number; im: number }, { re: number; im: number }, { re: number; im: number }];
    const parts = symmetricalComponents(a, b, c);
    expect(Math.hypot(parts.zero.re, parts.zero.im)).toBeCloseTo(reference.threePhase.zero, 9);
    expect(Math.hypot(parts.positive.re, parts.positive.im)).toBeCloseTo(reference.threePhase.positive, 9);
    expect(Math.hypot(parts.negative.re, parts.negative.im)).toBeCloseTo(reference.threePhase.negative, 9);
    expect(computeVuf(parts.positive, parts.negative)).toBeCloseTo(reference.threePhase.vufPercent, 9);
  });

  it("symmetricalComponents of a balanced A-B-C set is all positive sequence (closed form)", () => {
    const phase = (deg: number) => ({ re: Math.cos((deg * Math.PI) / 180), im: Math.sin((deg * Math.PI) / 180) });
    const parts = symmetricalComponents(phase(0), phase(-120), phase(120));
    expect(Math.hypot(parts.positive.re, parts.positive.im)).toBeCloseTo(1, 12);
    expect(Math.hypot(parts.negative.re, parts.negative.im)).toBeCloseTo(0, 12);
  });
});

describe("wrapDeg", () => {
  it("wrapDeg maps angles into (−180°, 180°] (definition, DOMAIN §6)", () => {
    expect(wrapDeg(180)).toBe(180);
    expect(wrapDeg(-180)).toBe(180);
    expect(wrapDeg(190)).toBeCloseTo(-170, 12);
    expect(wrapDeg(-540)).toBe(180);
    expect(displacementDeg({ re: 1, im: 0 }, { re: Math.cos(-2.0944), im: Math.sin(-2.0944) })).toBeCloseTo(120, 3);
  });
});

describe("analyseCapture three-phase", () => {
  const fixture = reference.threePhase;
  const capture = captureOf(
    fixture.samples.map((samples, index) => ({ id: ["V_AN (V)", "V_BN (V)", "V_CN (V)"][index]!, samples: Float64Array.from(samples) })),
    fixture.sampleRateHz,
  );
  const report = analyseCapture(capture, {});

  it("analyseCapture(unbalanced fixture) gives numpy's VUF within 0.02 pp and displacements within 0.05° (numpy fixture)", () => {
    const tp = report.threePhase!;
    expect(tp.basis).toBe("line-neutral");
    expect(Math.abs(tp.unbalance.vufPercent! - fixture.vufPercent)).toBeLessThan(VUF_PP);
    const got = [tp.displacementDeg.ab, tp.displacementDeg.bc, tp.displacementDeg.ca];
    got.forEach((value, index) => expect(angleGapDeg(value, fixture.displacementDeg[index]!)).toBeLessThan(PHASE_DEG));
    expect(tp.sequence).toBe("positive");
  });

  it("analyseCapture derives line-line RMS from line-neutral channels (numpy fixture)", () => {
    report.threePhase!.lineToLine.forEach((line, index) => {
      expect(line.source).toBe("derived");
      expect(relativeError(line.rms, fixture.lineLineRms[index]!)).toBeLessThan(5e-4);
    });
  });

  it("analyseCapture(balanced star set) derives V_LL = √3·V_LN with +30° (derived check value, DOMAIN §6)", () => {
    const fs = 10000;
    const make = (shift: number) => synthesise([{ order: 1, amplitude: 325 }], 50, fs, 2001, shift);
    const balanced = analyseCapture(
      captureOf([{ id: "van", samples: make(0) }, { id: "vbn", samples: make((-2 * Math.PI) / 3) }, { id: "vcn", samples: make((2 * Math.PI) / 3) }], fs),
      {},
    );
    const vab = balanced.threePhase!.lineToLine[0]!;
    expect(relativeError(vab.rms, Math.sqrt(3) * (325 / Math.SQRT2))).toBeLessThan(5e-4);
    expect(balanced.threePhase!.unbalance.nemaPercent!).toBeLessThan(0.01);
    expect(balanced.threePhase!.unbalance.ieeePercent!).toBeLessThan(0.01);
  });

  it("analyseCapture reports negative sequence when B and C are swapped (closed form)", () => {
    const fs = 10000;
    const make = (shift: number) => synthesise([{ order: 1, amplitude: 100 }], 50, fs, 1001, shift);
    const swapped = analyseCapture(captureOf([{ id: "vab", samples: make(0) }, { id: "vbc", samples: make((2 * Math.PI) / 3) }, { id: "vca", samples: make((-2 * Math.PI) / 3) }], fs), {});
    expect(swapped.threePhase!.basis).toBe("line-line");
    expect(swapped.threePhase!.sequence).toBe("negative");
    expect(swapped.threePhase!.unbalance.ieeePercent).toBeNull();
  });
});
