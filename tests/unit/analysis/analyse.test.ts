import { describe, expect, it } from "vitest";
import { CaptureRejection, analyseCapture, analysisReportSchema, computeWaveformEnvelope, type AnalysisReport } from "@/lib/analysis";
import { captureOf, relativeError, seededNoise, synthesise } from "./signals";

const codes = (report: AnalysisReport): string[] => report.warnings.map((warning) => warning.code);

function allFinite(value: unknown): boolean {
  if (typeof value === "number") return Number.isFinite(value);
  if (Array.isArray(value)) return value.every(allFinite);
  if (value && typeof value === "object") return Object.values(value).every(allFinite);
  return true;
}

describe("analyseCapture report", () => {
  const fs = 25000;
  const f = 60.02;
  const make = (shift: number) => synthesise([{ order: 1, amplitude: 679 }, { order: 5, amplitude: 14, phaseRad: 0.3 }, { order: 11, amplitude: 5 }], f, fs, 5000, shift);
  const capture = captureOf(
    [
      { id: "U L1-L2 (V)", samples: make(0) },
      { id: "U L2-L3 (V)", samples: make((-2 * Math.PI) / 3) },
      { id: "U L3-L1 (V)", samples: make((2 * Math.PI) / 3) },
    ],
    fs,
  );
  const report = analyseCapture(capture, { groupingIec: true, speedRpm: 1200.4 });

  it("analyseCapture output validates against analysisReportSchema and holds no NaN or Infinity (contract)", () => {
    expect(() => analysisReportSchema.parse(report)).not.toThrow();
    expect(allFinite(report)).toBe(true);
    expect(report.channels.map((c) => c.role)).toEqual(["vab", "vbc", "vca"]);
  });

  it("analyseCapture computes TIF for a 60 Hz machine and IEC groups when asked (closed form)", () => {
    const channel = report.channels[0]!;
    expect(channel.tif).not.toBeNull();
    expect(channel.harmonicGroups).not.toBeNull();
    const fifthGroup = channel.harmonicGroups!.find((g) => g.order === 5)!;
    expect(relativeError(fifthGroup.rms, 14 / Math.SQRT2)).toBeLessThan(1e-3);
    expect(Math.abs(channel.thdGroupedPercent! - channel.thdFPercent!)).toBeLessThan(0.01);
  });

  it("analyseCapture RMS, THD-F and frequency meet the issue's bars on a 60 Hz set (closed form)", () => {
    const channel = report.channels[1]!;
    expect(relativeError(channel.rms, Math.sqrt((679 ** 2 + 14 ** 2 + 5 ** 2) / 2))).toBeLessThan(5e-4);
    expect(Math.abs(channel.thdFPercent! - (100 * Math.hypot(14, 5)) / 679)).toBeLessThan(0.05);
    expect(relativeError(report.frequencyHz, f)).toBeLessThan(1e-4);
    // Without a rating nothing is judged, and an unjudged capture is inconclusive, never a pass.
    expect(report.overall).toBe("inconclusive");
    expect(report.verdicts).toEqual([]);
  });
});

describe("analyseCapture quality warnings", () => {
  it("analyseCapture warns on clipping (flat tops at the extremes, DOMAIN §10)", () => {
    const x = synthesise([{ order: 1, amplitude: 10 }], 50, 10000, 4001).map((v) => Math.max(-8, Math.min(8, v)));
    expect(codes(analyseCapture(captureOf([{ id: "V", samples: x }], 10000), {}))).toContain("clipping");
    const clean = synthesise([{ order: 1, amplitude: 10 }], 50, 10000, 4001).map((v) => Math.round(v * 100) / 100);
    expect(codes(analyseCapture(captureOf([{ id: "V", samples: clean }], 10000), {}))).not.toContain("clipping");
  });

  it("analyseCapture warns under 5 whole cycles and rejects under 2 (DOMAIN §10)", () => {
    const few = synthesise([{ order: 1, amplitude: 1 }], 50, 10000, 800);
    expect(codes(analyseCapture(captureOf([{ id: "V", samples: few }], 10000), {}))).toContain("few-cycles");
    const tooFew = synthesise([{ order: 1, amplitude: 1 }], 50, 10000, 300);
    expect(() => analyseCapture(captureOf([{ id: "V", samples: tooFew }], 10000), {})).toThrow(CaptureRejection);
  });

  it("analyseCapture warns when the sample rate is too low for the harmonic order (fs > 2·H·f1, DOMAIN §10)", () => {
    const x = synthesise([{ order: 1, amplitude: 1 }], 50, 2000, 2000);
    const report = analyseCapture(captureOf([{ id: "V", samples: x }], 2000), { harmonics: 50 });
    expect(codes(report)).toContain("sample-rate-low");
    expect(Math.max(...report.channels[0]!.harmonics.map((h) => h.order))).toBe(19);
  });

  it("analyseCapture warns on a large DC offset (DOMAIN §10)", () => {
    const x = synthesise([{ order: 0, amplitude: 5 }, { order: 1, amplitude: 100 }], 50, 10000, 2001);
    const report = analyseCapture(captureOf([{ id: "V", samples: x }], 10000), {});
    expect(codes(report)).toContain("dc-offset");
    expect(report.channels[0]!.dc).toBeCloseTo(5, 6);
  });

  it("analyseCapture rejects a flat record as having no fundamental (explicit rejection)", () => {
    const flat = new Float64Array(1000).fill(1);
    expect(() => analyseCapture(captureOf([{ id: "V", samples: flat }], 1000), {})).toThrow(CaptureRejection);
  });

  it("analyseCapture keeps a noisy channel's THD finite and reports every warning with a message (seeded noise)", () => {
    const noise = seededNoise(3);
    const x = synthesise([{ order: 1, amplitude: 1 }], 50, 5000, 5000).map((v) => v + 0.05 * noise());
    const report = analyseCapture(captureOf([{ id: "V", samples: x }, { id: "I_A", unit: "A", samples: new Float64Array(5000) }], 5000), {});
    expect(allFinite(report)).toBe(true);
    expect(report.channels[1]!.thdFPercent).toBeNull();
    expect(codes(report)).toContain("no-fundamental");
    expect(report.warnings.every((w) => w.message.length > 10)).toBe(true);
  });
});

describe("computeWaveformEnvelope", () => {
  it("computeWaveformEnvelope keeps each bucket's extremes (closed form)", () => {
    const x = Float64Array.from({ length: 1000 }, (_, n) => (n === 537 ? 9 : Math.sin(n / 10)));
    const envelope = computeWaveformEnvelope(captureOf([{ id: "V", samples: x }], 1000), 10);
    expect(envelope.timeS).toHaveLength(10);
    expect(envelope.timeS[5]).toBeCloseTo(0.5, 12);
    expect(envelope.channels[0]!.max[5]).toBe(9);
    expect(Math.max(...envelope.channels[0]!.max)).toBe(9);
    expect(Math.min(...envelope.channels[0]!.min)).toBeCloseTo(-1, 3);
  });
});
