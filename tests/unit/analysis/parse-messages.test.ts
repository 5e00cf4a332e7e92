import { describe, expect, it } from "vitest";
import { rejectionOf } from "./rejection-of";
import { CaptureRejection, createCaptureParser, MAX_COLUMNS, parseCaptureText } from "@/lib/analysis";


const rows = (n: number, cell: (i: number) => string): string[] => Array.from({ length: n }, (_, i) => `${(i * 1e-3).toFixed(3)},${cell(i)}`);

describe("createCaptureParser names the real cause", () => {
  it("createCaptureParser rejects a 50 MB single line as a line with no end, not as an empty file", () => {
    for (const engine of ["fast", "reference"] as const) {
      const parser = createCaptureParser({ engine });
      const chunk = new Uint8Array(1 << 20).fill(0x37);
      const rejection = rejectionOf(() => {
        for (let i = 0; i < 50; i++) parser.push(chunk);
        parser.finish();
      });
      expect([rejection.code, rejection.line]).toEqual(["line-too-long", 1]);
      expect(rejection.message).toContain("no line end");
    }
  });

  it("createCaptureParser rejects 100 000 columns with the column limit's own message", () => {
    const line = Array.from({ length: 100_000 }, (_, i) => String(i % 10)).join(",");
    for (const engine of ["fast", "reference"] as const) {
      const rejection = rejectionOf(() => parseCaptureText(`${line}\n${line}\n${line}\n${line}\n`, { engine }));
      expect([rejection.code, rejection.line]).toEqual(["too-many-columns", 1]);
      expect(rejection.message).toContain(`More than ${MAX_COLUMNS} columns`);
    }
  });

  it("createCaptureParser takes MAX_COLUMNS columns and refuses one more (limit edge)", () => {
    const header = (n: number) => ["t (s)", ...Array.from({ length: n - 1 }, (_, i) => `c${i} (V)`)].join(",");
    const body = (n: number) => Array.from({ length: 20 }, (_, r) => [String(r / 1000), ...Array.from({ length: n - 1 }, () => "1")].join(","));
    expect(parseCaptureText([header(MAX_COLUMNS), ...body(MAX_COLUMNS)].join("\n")).channels).toHaveLength(MAX_COLUMNS - 1);
    expect(rejectionOf(() => parseCaptureText([header(MAX_COLUMNS + 1), ...body(MAX_COLUMNS + 1)].join("\n"))).code).toBe("too-many-columns");
  });

  it("createCaptureParser decodes UTF-16 LE and BE with a byte-order mark split across chunks", () => {
    const text = ["Time (s),V_AN (V)", ...rows(40, (i) => (Math.sin(i / 4) * 100).toFixed(3))].join("\r\n");
    const utf8 = parseCaptureText(text);
    for (const encoding of ["le", "be"] as const) {
      const le = Buffer.from(`\uFEFF${text}`, "utf16le");
      const bytes = encoding === "le" ? le : Buffer.from(le).swap16();
      for (const size of [1, 3, 64]) {
        const parser = createCaptureParser();
        for (let offset = 0; offset < bytes.length; offset += size) parser.push(new Uint8Array(bytes.subarray(offset, offset + size)));
        const capture = parser.finish();
        expect(Array.from(capture.channels[0]!.samples)).toEqual(Array.from(utf8.channels[0]!.samples));
        expect(capture.sampleRateHz).toBe(utf8.sampleRateHz);
      }
    }
  });

  it("createCaptureParser names UTF-16 without a byte-order mark instead of binary data", () => {
    const bytes = Buffer.from(["Time (s),V (V)", ...rows(30, (i) => String(i))].join("\n"), "utf16le");
    const parser = createCaptureParser();
    const rejection = rejectionOf(() => {
      parser.push(new Uint8Array(bytes));
      parser.finish();
    });
    expect(rejection.code).toBe("utf16-no-bom");
    expect(rejection.message).toContain("UTF-16 (LE)");
  });

  it("parseCaptureText refuses a negative sample rate in the preamble where it is written", () => {
    const text = ["Instrument: invented", "Sample rate: -5 kHz", "CH1 (V)", ...Array.from({ length: 30 }, (_, i) => String(Math.sin(i)))].join("\n");
    const rejection = rejectionOf(() => parseCaptureText(text));
    expect([rejection.code, rejection.line]).toEqual(["bad-sample-rate", 2]);
  });

  it("parseCaptureText refuses a zero increment in the header region on its line", () => {
    const text = ["X,CH1,Start,Increment", "Sequence,Volt,0,0", ...Array.from({ length: 30 }, (_, i) => `${i},${Math.sin(i)},,`)].join("\n");
    const rejection = rejectionOf(() => parseCaptureText(text));
    expect([rejection.code, rejection.line]).toEqual(["bad-sample-interval", 2]);
  });

  it("parseCaptureText names hex values on the line they are on, even in the second data row", () => {
    const text = ["Time (s),CH1 (V)", ...rows(30, (i) => (i === 1 ? "0x1F" : String(i)))].join("\n");
    for (const engine of ["fast", "reference"] as const) {
      const rejection = rejectionOf(() => parseCaptureText(text, { engine }));
      expect([rejection.code, rejection.line, rejection.column]).toEqual(["hex-value", 3, "CH1 (V)"]);
    }
  });

  it("parseCaptureText rejects a value beyond the sample range on both paths, after the probe ratio", () => {
    const text = ["Time (s),CH1 (V)", ...rows(30, (i) => (i === 4 ? "1e95" : "1"))].join("\n");
    expect(parseCaptureText(text).channels[0]!.samples[4]).toBe(1e95);
    for (const engine of ["fast", "reference"] as const) {
      const rejection = rejectionOf(() => parseCaptureText(text, { engine, calibration: { "CH1 (V)": { scale: 1e6 } } }));
      expect([rejection.code, rejection.line, rejection.column]).toEqual(["value-out-of-range", 6, "CH1 (V)"]);
    }
  });

  it("parseCaptureText takes the caller's sample rate over the preamble's for an index column (options)", () => {
    const text = ["Sample rate: 2 kHz", "Index,CH1 (V)", ...Array.from({ length: 30 }, (_, i) => `${i},${Math.sin(i)}`)].join("\n");
    expect(parseCaptureText(text).sampleRateHz).toBeCloseTo(2000, 9);
    expect(parseCaptureText(text, { sampleRateHz: 8000 }).sampleRateHz).toBeCloseTo(8000, 9);
    expect(parseCaptureText(text).channels.map((c) => c.id)).toEqual(["CH1 (V)"]);
  });
});
