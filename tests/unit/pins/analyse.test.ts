import { describe, expect, it } from "vitest";
import { analyseCapture } from "@/lib/analysis/analyse";
import { captureOf, synthesise } from "../analysis/signals";
import { rel } from "./steps";

const codes = (report: ReturnType<typeof analyseCapture>) => report.warnings.map((w) => w.code);

describe("analyseCapture thresholds (pins)", () => {
  it("analyseCapture warns of few cycles below 5 whole cycles, not at 5 (4.5 and 5.5 cycles of 50 Hz at 1 kS/s)", () => {
    const at = (count: number) => codes(analyseCapture(captureOf([{ id: "v", samples: synthesise([{ order: 1, amplitude: 100 }], 50, 1000, count) }], 1000), {}));
    expect(at(110)).not.toContain("few-cycles");
    expect(at(90)).toContain("few-cycles");
  });

  it("analyseCapture warns of a low sample rate only when the orders asked pass Nyquist (45 Hz at 1 kS/s: order 11 is the last below 500 Hz)", () => {
    const capture = captureOf([{ id: "v", samples: synthesise([{ order: 1, amplitude: 100 }], 45, 1000, 2000) }], 1000);
    expect(codes(analyseCapture(capture, { harmonics: 11 }))).not.toContain("sample-rate-low");
    expect(codes(analyseCapture(capture, { harmonics: 12 }))).toContain("sample-rate-low");
  });

  it("analyseCapture takes Ke from one line-neutral channel × √3: 230 V RMS at 1500 rpm gives 230·√3/1.5 V/krpm (closed form)", () => {
    const samples = synthesise([{ order: 1, amplitude: 230 * Math.SQRT2 }], 50, 20000, 4000);
    const report = analyseCapture(captureOf([{ id: "van", samples }], 20000), { speedRpm: 1500 });
    expect(rel(report.backEmf!.keLineRmsPerKrpm, (230 * Math.sqrt(3)) / 1.5)).toBeLessThan(1e-6);
  });
});
