import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CaptureRejection, createCaptureParser, parseCaptureText } from "@/lib/analysis";

const SEED = 20260412;

/** Samples every layout below writes; values carry 4 decimals so each layout can print them exactly. */
const sampleRows = fc.array(fc.tuple(fc.integer({ min: -9_999_999, max: 9_999_999 }), fc.integer({ min: -9_999_999, max: 9_999_999 })), { minLength: 20, maxLength: 60 });

const layout = fc.record({
  dialect: fc.constantFrom({ delimiter: ",", decimal: "." }, { delimiter: ";", decimal: "." }, { delimiter: ";", decimal: "," }, { delimiter: "\t", decimal: "." }, { delimiter: "\t", decimal: "," }),
  bom: fc.boolean(),
  crlf: fc.boolean(),
  preamble: fc.boolean(),
  withTime: fc.boolean(),
  millivolts: fc.boolean(),
  scientific: fc.boolean(),
  trailingColumns: fc.integer({ min: 0, max: 2 }),
  blankLinesAtEnd: fc.integer({ min: 0, max: 3 }),
  quoted: fc.boolean(),
});

type Layout = typeof layout extends fc.Arbitrary<infer T> ? T : never;

function writeCapture(rows: [number, number][], l: Layout): string {
  const { delimiter, decimal } = l.dialect;
  const number = (value: number): string => {
    const text = l.scientific ? value.toExponential(6) : value.toString();
    const cell = decimal === "," ? text.replace(".", ",") : text;
    return l.quoted ? `"${cell}"` : cell;
  };
  const scale = l.millivolts ? 1000 : 1;
  const unit = l.millivolts ? "mV" : "V";
  const trailing = delimiter.repeat(l.trailingColumns);
  const lines: string[] = [];
  if (l.preamble) lines.push(`Instrument${delimiter}Invented scope`, `Sample interval${delimiter}${decimal === "," ? "0,001" : "0.001"} s`, "");
  lines.push([...(l.withTime ? ["Time (s)"] : []), `V_AN (${unit})`, `V_BN [${unit}]`].join(delimiter) + trailing);
  rows.forEach(([a, b], n) => {
    const cells = [number(a / 1e4 * scale), number(b / 1e4 * scale)];
    lines.push([...(l.withTime ? [number(n / 1000)] : []), ...cells].join(delimiter) + trailing);
  });
  for (let i = 0; i < l.blankLinesAtEnd; i++) lines.push("");
  const eol = l.crlf ? "\r\n" : "\n";
  return (l.bom ? "\uFEFF" : "") + lines.join(eol) + eol;
}

describe("parseCaptureText properties", () => {
  it("parseCaptureText of random layouts of the same samples gives the same arrays (fast-check, seeded)", () => {
    fc.assert(
      fc.property(sampleRows, layout, fc.integer({ min: 1, max: 97 }), (rows, l, chunk) => {
        fc.pre(l.preamble || l.withTime);
        const text = writeCapture(rows, l);
        const expectedA = rows.map(([a]) => a / 1e4);
        const expectedB = rows.map(([, b]) => b / 1e4);
        const fast = parseCaptureText(text);
        const reference = parseCaptureText(text, { engine: "reference" });
        const bytes = new TextEncoder().encode(text);
        const streamed = createCaptureParser();
        for (let offset = 0; offset < bytes.length; offset += chunk) streamed.push(bytes.subarray(offset, offset + chunk));
        const chunked = streamed.finish();
        for (const capture of [fast, reference, chunked]) {
          expect(capture.sampleCount).toBe(rows.length);
          expect(capture.sampleRateHz).toBeCloseTo(1000, 6);
          expect(capture.channels.map((c) => c.unit)).toEqual(["V", "V"]);
          capture.channels[0]!.samples.forEach((v, i) => expect(v).toBeCloseTo(expectedA[i]!, 9));
          capture.channels[1]!.samples.forEach((v, i) => expect(v).toBeCloseTo(expectedB[i]!, 9));
        }
        expect(Array.from(fast.channels[0]!.samples)).toEqual(Array.from(reference.channels[0]!.samples));
        expect(Array.from(fast.channels[1]!.samples)).toEqual(Array.from(chunked.channels[1]!.samples));
      }),
      { seed: SEED, numRuns: 150 },
    );
    // 450 parses, byte-chunked ones among them: seconds on a loaded machine. Behaviour, not timing.
  }, 30_000);

  it("parseCaptureText of random garbage throws nothing but a located CaptureRejection (fast-check, seeded)", () => {
    const garbage = fc.oneof(
      fc.string({ unit: "binary", maxLength: 400 }),
      fc.uint8Array({ maxLength: 400 }).map((bytes) => new TextDecoder().decode(bytes)),
      fc.array(fc.constantFrom("0", "1.5", "-", "e", "E+", ",", ";", "\t", "\n", "\r\n", " ", '"', "x", "NaN", "1e999", "time", "V"), { maxLength: 300 }).map((parts) => parts.join("")),
    );
    fc.assert(
      fc.property(garbage, (text) => {
        try {
          const capture = parseCaptureText(text);
          for (const channel of capture.channels) channel.samples.forEach((v) => expect(Number.isFinite(v)).toBe(true));
        } catch (error) {
          expect(error).toBeInstanceOf(CaptureRejection);
          const rejection = error as CaptureRejection;
          expect(rejection.code.length).toBeGreaterThan(0);
          expect(rejection.message.length).toBeGreaterThan(10);
          if (!["empty", "oversize", "no-time-base"].includes(rejection.code)) expect(rejection.line ?? rejection.column).toBeDefined();
        }
      }),
      { seed: SEED, numRuns: 400 },
    );
  });
});
