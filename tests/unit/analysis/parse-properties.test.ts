import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CaptureRejection, createCaptureParser, parseCaptureText } from "@/lib/analysis";

const SEED = 20260412;

/** Samples every layout below writes; values carry 4 decimals so each layout can print them exactly. */
const sampleRows = fc.array(fc.tuple(fc.integer({ min: -9_999_999, max: 9_999_999 }), fc.integer({ min: -9_999_999, max: 9_999_999 })), { minLength: 20, maxLength: 60 });

const TIME_SPELLINGS: [string, number][] = [
  ["Time (s)", 1], ["Time_ms", 1e-3], ["ms", 1e-3], ["[µs]", 1e-6], ["Zeit [ns]", 1e-9], ["Tiempo (s)", 1], ["t_us", 1e-6],
  ["时间 (ms)", 1e-3], ["TIME", 1], ["Temps (ms)", 1e-3], ["Czas [s]", 1],
];

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
  /** How time is written: a time column spelled one of many ways, a sample-index column, or neither. */
  time: fc.constantFrom("column", "index", "none"),
  timeSpelling: fc.constantFrom(...TIME_SPELLINGS),
  indexName: fc.constantFrom("Index", "Sample", "Nr", "Point", "X"),
  /** Where an index column's time base comes from when the preamble is off. */
  indexBase: fc.constantFrom("header-start-increment", "caller"),
  unitsRow: fc.boolean(),
  /** Time name and its unit in the units row (with its factor to seconds). */
  unitsRowTime: fc.constantFrom<[string, string, number]>(["Time", "s", 1], ["Zeit", "ms", 1e-3], ["Temps", "(µs)", 1e-6], ["Tiempo", "[ns]", 1e-9]),
  leadingMetadata: fc.boolean(),
  utf16: fc.constantFrom("none", "le", "be"),
});

/** Time headers with the factor from their unit to seconds (units in brackets, joined, alone, in other languages). */

type Layout = typeof layout extends fc.Arbitrary<infer T> ? T : never;

function writeCapture(rows: [number, number][], l: Layout): { text: string; options: { sampleRateHz?: number } } {
  const { delimiter, decimal } = l.dialect;
  const number = (value: number): string => {
    const text = l.scientific ? value.toExponential(6) : value.toString();
    const cell = decimal === "," ? text.replace(".", ",") : text;
    return l.quoted ? `"${cell}"` : cell;
  };
  const scale = l.millivolts ? 1000 : 1;
  const unit = l.millivolts ? "mV" : "V";
  const trailing = delimiter.repeat(l.trailingColumns);
  const [timeHeader, timeFactor] = l.timeSpelling;
  const startIncrement = l.time === "index" && !l.preamble && l.indexBase === "header-start-increment";
  const options = l.time === "index" && !l.preamble && l.indexBase === "caller" ? { sampleRateHz: 1000 } : {};
  const lines: string[] = [];
  if (l.leadingMetadata) {
    // Key / value / unit in the first three columns of the first rows, no header row, time in seconds.
    const keys = [["Record Length", String(rows.length), "Points"], ["Sample Interval", decimal === "," ? "0,001" : "0.001", "s"], ["Source", "CH1", ""]];
    rows.forEach(([a, b], n) => {
      const lead = keys[n] ?? ["", "", ""];
      lines.push([...lead, number(n / 1000), number(a / 1e4), number(b / 1e4)].join(delimiter) + trailing);
    });
  } else {
    if (l.preamble) lines.push(`Instrument${delimiter}Invented scope`, `Sample interval${delimiter}${decimal === "," ? "0,001" : "0.001"} s`, "");
    const timeName = l.time === "index" ? l.indexName : l.unitsRow ? l.unitsRowTime[0] : timeHeader;
    const names = [...(l.time !== "none" ? [timeName] : []), l.unitsRow ? "V_AN" : `V_AN (${unit})`, l.unitsRow ? "V_BN" : `V_BN [${unit}]`];
    if (startIncrement) names.push("Start", "Increment");
    lines.push(names.join(delimiter) + trailing);
    if (l.unitsRow || startIncrement) {
      const units = [...(l.time === "index" ? ["Sequence"] : l.time === "column" ? [l.unitsRowTime[1]] : []), unit, unit];
      if (startIncrement) units.push("0", decimal === "," ? "0,001" : "0.001");
      lines.push(units.join(delimiter) + trailing);
    }
    rows.forEach(([a, b], n) => {
      const cells = [number((a / 1e4) * scale), number((b / 1e4) * scale)];
      const time = l.time === "index" ? [String(n)] : l.time === "column" ? [number(n / 1000 / (l.unitsRow ? l.unitsRowTime[2] : timeFactor))] : [];
      lines.push([...time, ...cells].join(delimiter) + (startIncrement && !trailing ? delimiter.repeat(2) : trailing));
    });
  }
  for (let i = 0; i < l.blankLinesAtEnd; i++) lines.push("");
  const eol = l.crlf ? "\r\n" : "\n";
  return { text: (l.bom || l.utf16 !== "none" ? "\uFEFF" : "") + lines.join(eol) + eol, options };
}

function encode(text: string, l: Layout): Uint8Array {
  if (l.utf16 === "none") return new TextEncoder().encode(text);
  const le = Buffer.from(text, "utf16le");
  return new Uint8Array(l.utf16 === "le" ? le : Buffer.from(le).swap16());
}

describe("parseCaptureText properties", () => {
  it("parseCaptureText of random layouts of the same samples gives the same arrays (fast-check, seeded)", () => {
    fc.assert(
      fc.property(sampleRows, layout, fc.integer({ min: 1, max: 97 }), (rows, l, chunk) => {
        fc.pre(l.preamble || l.time !== "none" || l.leadingMetadata);
        fc.pre(!l.leadingMetadata || !l.millivolts);
        // A bare "X" is read as an index only beside a stated interval or a "Sequence" units cell.
        fc.pre(l.indexName !== "X" || l.time !== "index" || l.preamble || l.indexBase === "header-start-increment" || l.unitsRow);
        const { text, options } = writeCapture(rows, l);
        const expectedA = rows.map(([a]) => a / 1e4);
        const expectedB = rows.map(([, b]) => b / 1e4);
        const bytes = encode(text, l);
        const whole = (engine: "fast" | "reference") => {
          const parser = createCaptureParser({ ...options, engine });
          parser.push(bytes);
          return parser.finish();
        };
        const fast = whole("fast");
        const reference = whole("reference");
        const streamed = createCaptureParser(options);
        for (let offset = 0; offset < bytes.length; offset += chunk) streamed.push(bytes.subarray(offset, offset + chunk));
        const chunked = streamed.finish();
        if (l.utf16 === "none") expect(Array.from(parseCaptureText(text, options).channels[0]!.samples)).toEqual(Array.from(fast.channels[0]!.samples));
        for (const capture of [fast, reference, chunked]) {
          expect(capture.sampleCount).toBe(rows.length);
          expect(capture.sampleRateHz).toBeCloseTo(1000, 6);
          expect(capture.channels).toHaveLength(2);
          if (!l.leadingMetadata) expect(capture.channels.map((c) => c.unit)).toEqual(["V", "V"]);
          capture.channels[0]!.samples.forEach((v, i) => expect(v).toBeCloseTo(expectedA[i]!, 9));
          capture.channels[1]!.samples.forEach((v, i) => expect(v).toBeCloseTo(expectedB[i]!, 9));
        }
        expect(Array.from(fast.channels[0]!.samples)).toEqual(Array.from(reference.channels[0]!.samples));
        expect(Array.from(fast.channels[1]!.samples)).toEqual(Array.from(chunked.channels[1]!.samples));
      }),
      { seed: SEED, numRuns: 200 },
    );
    // 450 parses, byte-chunked ones among them: seconds on a loaded machine. Behaviour, not timing.
  }, 60_000);

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
