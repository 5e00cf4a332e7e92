import { readFileSync, readdirSync } from "node:fs";
import { rejectionOf } from "./rejection-of";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { CaptureRejection, createCaptureParser, parseCaptureText, sniffCaptureHeader, type ParsedCapture } from "@/lib/analysis";
import { FIXTURE_DIR } from "./fixtures";

const layouts = readdirSync(path.join(FIXTURE_DIR, "layouts")).sort();
const rejects = readdirSync(path.join(FIXTURE_DIR, "rejects")).sort();
const readText = (dir: string, name: string): string => new TextDecoder().decode(readFileSync(path.join(FIXTURE_DIR, dir, name)));


function sameCapture(a: ParsedCapture, b: ParsedCapture): void {
  expect(a.sampleCount).toBe(b.sampleCount);
  expect(a.sampleRateHz).toBe(b.sampleRateHz);
  expect(a.channels.map((c) => [c.id, c.unit])).toEqual(b.channels.map((c) => [c.id, c.unit]));
  a.channels.forEach((channel, index) => expect(Array.from(channel.samples)).toEqual(Array.from(b.channels[index]!.samples)));
}

describe("parseCaptureText on the layout samples", () => {
  for (const name of layouts) {
    it(`parseCaptureText(${name}) gives the same arrays on the fast and the papaparse paths`, () => {
      const text = readText("layouts", name);
      sameCapture(parseCaptureText(text, { engine: "fast" }), parseCaptureText(text, { engine: "reference" }));
    });
  }

  it("parseCaptureText reads every layout to the same SI samples (fixture: one waveform, six layouts)", () => {
    const volts = layouts.filter((name) => name !== "bench-layout.csv").map((name) => parseCaptureText(readText("layouts", name)));
    for (const capture of volts) {
      expect(capture.sampleCount).toBe(400);
      expect(capture.sampleRateHz).toBeCloseTo(4000, 6);
      const first = capture.channels[0]!.samples;
      expect(first[1]).toBeCloseTo(329.8106, 2);
    }
  });

  it("parseCaptureText converts mV, kV and mA headers to SI and reads decimal commas (fixture layouts)", () => {
    const semicolon = parseCaptureText(readText("layouts", "semicolon-comma-preamble-bom-crlf.csv"));
    expect(semicolon.channels.map((c) => c.id)).toEqual(["V_AN [V]", "V_BN [V]", "I_A [mA]"]);
    expect(semicolon.channels[2]!.unit).toBe("A");
    expect(semicolon.channels[2]!.samples[0]).toBeCloseTo(12.5 * Math.cos(0.3), 2); // 12.5 A·cos(ωt − 0.3) written in mA
    expect(semicolon.metadata["Instrument"]).toBe("Invented DAQ 8");
    const tab = parseCaptureText(readText("layouts", "tab-units-row.csv"));
    expect(tab.channels.map((c) => c.unit)).toEqual(["V", "V", "A"]);
    expect(tab.timeStartS).toBe(0);
    const noTime = parseCaptureText(readText("layouts", "no-time-rate-in-preamble.csv"));
    expect(noTime.sampleRateHz).toBe(4000);
    expect(noTime.metadata["Sampling rate"]).toBe("4 kHz");
  });

  it("createCaptureParser gives the same capture whatever the chunk boundaries (streaming)", () => {
    const bytes = new TextEncoder().encode(readText("layouts", "semicolon-comma-preamble-bom-crlf.csv"));
    const whole = parseCaptureText(readText("layouts", "semicolon-comma-preamble-bom-crlf.csv"));
    for (const size of [1, 7, 64, 1000, 4096]) {
      const parser = createCaptureParser();
      for (let offset = 0; offset < bytes.length; offset += size) parser.push(bytes.subarray(offset, offset + size));
      sameCapture(parser.finish(), whole);
    }
  });

  it("parseCaptureText reads awkward numeric cells exactly as Number() does, on both paths (reference: Number)", () => {
    const cells = ["-0", "0.000000000000001", "123456789012345", "1234567890123456", "1.", "-.5", ".5", "007", "1e5", "-2.5E-3", "+4.25", " 3.5 ", "9007199254740993", "0.1", "1.5e99", "-1234.5678", "42"];
    const rows = cells.map((cell, i) => `${i * 1e-3},${cell}`);
    for (const engine of ["fast", "reference"] as const) {
      const samples = parseCaptureText(["t (s),v (V)", ...rows].join("\n"), { engine }).channels[0]!.samples;
      // Calibration is always applied (× 1 + 0), which turns −0 into +0 and changes nothing else.
      cells.forEach((cell, i) => expect(Object.is(samples[i], Number(cell.trim()) * 1 + 0)).toBe(true));
    }
  });

  it("parseCaptureText applies a per-channel probe ratio and offset (options)", () => {
    const text = readText("layouts", "comma-point.csv");
    const plain = parseCaptureText(text);
    const scaled = parseCaptureText(text, { calibration: { "V_AN (V)": { scale: 100, offset: -2 } } });
    expect(scaled.channels[0]!.samples[5]).toBeCloseTo(plain.channels[0]!.samples[5]! * 100 - 2, 9);
    expect(scaled.channels[1]!.samples[5]).toBe(plain.channels[1]!.samples[5]);
  });
});

describe("parseCaptureText rejections", () => {
  const expected: Record<string, { code: string; line?: number; column?: string }> = {
    "binary.csv": { code: "binary", line: 1 },
    "empty.csv": { code: "empty" },
    "non-numeric-cell.csv": { code: "non-numeric", line: 32, column: "V_AN (V)" },
    "text-only.csv": { code: "no-numeric-data", line: 3 },
    "time-backwards.csv": { code: "time-not-increasing", line: 42, column: "Time (s)" },
    "time-gap.csv": { code: "irregular-time", line: 22, column: "Time (s)" },
    "too-few-samples.csv": { code: "too-few-samples" },
    "unequal-length.csv": { code: "unequal-length", line: 52, column: "V_BN (V)" },
    "utf16-no-bom.csv": { code: "utf16-no-bom", line: 1 },
    "zero-interval.csv": { code: "bad-sample-interval", line: 1 },
    "negative-interval.csv": { code: "bad-sample-interval", line: 2 },
    "cr-only-line-ends.csv": { code: "cr-line-ends", line: 1 },
    "quoted-newline.csv": { code: "quoted-newline", line: 22, column: "V_AN (V)" },
    "hex-value.csv": { code: "hex-value", line: 35, column: "V_AN (V)" },
    "hex-all.csv": { code: "hex-value", line: 2, column: "ADC" },
    "huge-value.csv": { code: "value-out-of-range", line: 14, column: "V_AN (V)" },
    "index-without-time-base.csv": { code: "no-time-base", column: "Index" },
  };
  for (const name of rejects) {
    it(`parseCaptureText(${name}) is rejected with a located message on both paths`, () => {
      const text = readText("rejects", name);
      const want = expected[name];
      expect(want, `add an expectation for ${name}`).toBeDefined();
      for (const engine of ["fast", "reference"] as const) {
        const rejection = rejectionOf(() => parseCaptureText(text, { engine }));
        expect(rejection.code).toBe(want!.code);
        if (want!.line !== undefined) expect(rejection.line).toBe(want!.line);
        if (want!.column !== undefined) expect(rejection.column).toBe(want!.column);
        if (want!.line !== undefined) expect(rejection.message).toContain(`line ${want!.line}`);
      }
    });
  }

  it("parseCaptureText rejects a value that overflows a double, on both paths (no Infinity in samples)", () => {
    const rows = Array.from({ length: 30 }, (_, i) => `${i * 1e-3},${i === 12 ? "1e999" : Math.sin(i)}`);
    for (const engine of ["fast", "reference"] as const) {
      const rejection = rejectionOf(() => parseCaptureText(["t (s),v (V)", ...rows].join("\n"), { engine }));
      expect([rejection.code, rejection.line, rejection.column]).toEqual(["non-numeric", 14, "v (V)"]);
    }
  });

  it("createCaptureParser rejects input beyond maxBytes (options)", () => {
    const parser = createCaptureParser({ maxBytes: 100 });
    expect(() => parser.push(new Uint8Array(101).fill(48))).toThrow(CaptureRejection);
  });

  it("parseCaptureText rejects a file with no time base unless a sample rate is given (options)", () => {
    const text = ["CH1,CH2", ...Array.from({ length: 40 }, (_, i) => `${Math.sin(i)},${Math.cos(i)}`)].join("\n");
    expect(rejectionOf(() => parseCaptureText(text)).code).toBe("no-time-base");
    expect(parseCaptureText(text, { sampleRateHz: 1000 }).sampleRateHz).toBe(1000);
  });

  it("parseCaptureText warns on slightly uneven time steps and keeps going (quality check)", () => {
    const rows = Array.from({ length: 100 }, (_, i) => `${(i * 1e-3 + (i % 2 ? 2e-5 : 0)).toFixed(6)},${Math.sin(i / 5)}`);
    const capture = parseCaptureText(["t,v", ...rows].join("\n"));
    expect(capture.warnings.map((w) => w.code)).toContain("uneven-sampling");
  });

  it("parseCaptureText warns when a header names no unit (quality check)", () => {
    const rows = Array.from({ length: 40 }, (_, i) => `${i * 1e-3},${Math.sin(i)}`);
    expect(parseCaptureText(["time,ch1", ...rows].join("\n")).warnings.map((w) => w.code)).toContain("unit-assumed");
  });
});

describe("sniffCaptureHeader", () => {
  it("sniffCaptureHeader(first bytes) reports dialect, headers, metadata and roles (fixture layout)", () => {
    const head = readText("layouts", "semicolon-comma-preamble-bom-crlf.csv").slice(0, 300);
    const sniffed = sniffCaptureHeader(head);
    expect(sniffed.delimiter).toBe(";");
    expect(sniffed.decimal).toBe(",");
    expect(sniffed.headers).toEqual(["Time [ms]", "V_AN [V]", "V_BN [V]", "I_A [mA]"]);
    expect(sniffed.metadata["Sample Interval"]).toBe("0,00025 s");
    expect(sniffed.suggestedRoles).toEqual({ "V_AN [V]": "van", "V_BN [V]": "vbn", "I_A [mA]": "ia" });
  });

  it("sniffCaptureHeader leaves ambiguous or unknown headers as single voltages (roles rule from the issue)", () => {
    const sniffed = sniffCaptureHeader("Time,CH1,CH2\n0,1,2\n1,2,3\n2,3,4\n3,4,5\n");
    expect(sniffed.suggestedRoles).toEqual({ CH1: "v", CH2: "v" });
  });
});
