import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { createCaptureParser, sniffCaptureBytes, type ParsedCapture, type ParseOptions } from "@/lib/analysis";
import { FIXTURE_DIR } from "./fixtures";

/** Written by scripts/fixtures/make_layout_corpus.py (numpy): the signal every corpus file holds. */
interface Corpus {
  sampleRateHz: number;
  sampleCount: number;
  signals: Record<string, number[]>;
  rms: Record<string, number>;
  rmsWritten: Record<string, number>;
  layouts: Record<string, { channels: [string, string][]; timeStartS: number; options: ParseOptions; metadata: Record<string, string> }>;
}

const DIR = path.join(FIXTURE_DIR, "corpus");
const corpus = JSON.parse(readFileSync(path.join(DIR, "expected.json"), "utf8")) as Corpus;

function parseBytes(bytes: Uint8Array, options: ParseOptions, chunk: number): ParsedCapture {
  const parser = createCaptureParser(options);
  for (let offset = 0; offset < bytes.length; offset += chunk) parser.push(bytes.subarray(offset, offset + chunk));
  return parser.finish();
}

const rms = (samples: Float64Array): number => Math.sqrt(samples.reduce((sum, x) => sum + x * x, 0) / samples.length);

describe("createCaptureParser on the layout corpus", () => {
  it("the corpus has one file per layout, each described in expected.json", () => {
    const files = readdirSync(DIR).filter((name) => name !== "expected.json").sort();
    expect(files).toEqual(Object.keys(corpus.layouts).sort());
    expect(files.length).toBeGreaterThanOrEqual(15);
  });

  for (const [name, want] of Object.entries(corpus.layouts)) {
    it(`createCaptureParser(${name}) reads the known signal on the fast and papaparse paths, whole and in 13-byte chunks (numpy fixture)`, () => {
      const bytes = new Uint8Array(readFileSync(path.join(DIR, name)));
      const fast = parseBytes(bytes, want.options, bytes.length);
      const chunked = parseBytes(bytes, want.options, 13);
      const reference = parseBytes(bytes, { ...want.options, engine: "reference" }, 4096);
      for (const capture of [fast, chunked, reference]) {
        expect(capture.sampleCount).toBe(corpus.sampleCount);
        // The rate is 1 / mean step of the stamps written (or stated): exact to rounding.
        expect(capture.sampleRateHz / corpus.sampleRateHz - 1).toBeLessThan(1e-9);
        expect(capture.sampleRateHz / corpus.sampleRateHz - 1).toBeGreaterThan(-1e-9);
        expect(capture.timeStartS).toBeCloseTo(want.timeStartS, 12);
        expect(capture.channels.map((c) => c.id)).toEqual(want.channels.map(([id]) => id));
        want.channels.forEach(([, signal], index) => {
          const samples = capture.channels[index]!.samples;
          const exact = corpus.signals[signal]!;
          // Written with 4 decimals: every sample within half a unit of the last place.
          samples.forEach((x, i) => expect(Math.abs(x - exact[i]!)).toBeLessThanOrEqual(5.0001e-5));
          // RMS of the samples written, from numpy: a 0.1 % change in any scale shows at 1e-9.
          expect(Math.abs(rms(samples) / corpus.rmsWritten[signal]! - 1)).toBeLessThan(1e-9);
          expect(Math.abs(rms(samples) / corpus.rms[signal]! - 1)).toBeLessThan(1e-6);
        });
        for (const [key, value] of Object.entries(want.metadata)) expect(capture.metadata[key]).toBe(value);
      }
      for (const [a, b] of [[fast, chunked], [fast, reference]] as const) {
        a.channels.forEach((channel, index) => expect(Array.from(channel.samples)).toEqual(Array.from(b.channels[index]!.samples)));
      }
    });
  }

  it("sniffCaptureBytes reads the header of a UTF-16 file from its first bytes (fixture)", () => {
    const head = new Uint8Array(readFileSync(path.join(DIR, "utf16be-bom.csv"))).subarray(0, 400);
    const sniffed = sniffCaptureBytes(head);
    expect(sniffed.headers).toEqual(["Time (ms)", "V_AN (V)", "V_BN (V)"]);
    expect(sniffed.timeColumn).toBe("Time (ms)");
    expect(sniffed.suggestedRoles).toEqual({ "V_AN (V)": "van", "V_BN (V)": "vbn" });
  });

  it("sniffCaptureBytes names a sample-index column and the stated rate (fixture)", () => {
    const head = new Uint8Array(readFileSync(path.join(DIR, "index-interval-decimal-comma.csv"))).subarray(0, 600);
    const sniffed = sniffCaptureBytes(head);
    expect([sniffed.timeColumn, sniffed.timeIsIndex, sniffed.statedSampleRateHz]).toEqual(["Nr", true, 5000]);
  });
});
