import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import type { ParsedCapture, ParseOptions } from "@/lib/analysis";
import { readCaptureFile, type ParallelIngestOptions } from "@/lib/server/capture-reader";

const dir = mkdtempSync(path.join(tmpdir(), "parallel-ingest-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Enough rows for a file over 2 MiB, the smallest the two-thread path splits. */
const ROWS = 150_000;

interface Layout {
  delimiter: string;
  decimal: "." | ",";
  newline: string;
  preamble: string[];
  header: string[];
  time: boolean;
  /** Extra trailing delimiter on every row. */
  trailing?: boolean;
}

/** Deterministic sample rows; `edit(row, cells)` may change a row's cells (line numbers count from the first row). */
function writeCapture(name: string, layout: Layout, edit?: (row: number, cells: string[]) => string[] | null): string {
  const lines: string[] = [...layout.preamble, layout.header.join(layout.delimiter)];
  let state = 12345;
  const noise = (): number => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
  const channels = layout.header.length - (layout.time ? 1 : 0);
  for (let n = 0; n < ROWS; n++) {
    let cells: string[] = [];
    if (layout.time) cells.push((n / 10_000).toFixed(5));
    for (let c = 0; c < channels; c++) cells.push((325 * Math.sin(2 * Math.PI * 50 * (n / 10_000) - c * 2.1) + noise()).toFixed(3 + c));
    if (edit) {
      const edited = edit(n, cells);
      if (edited === null) continue;
      cells = edited;
    }
    const row = cells.map((cell) => (layout.decimal === "," ? cell.replace(".", ",") : cell)).join(layout.delimiter);
    lines.push(layout.trailing ? row + layout.delimiter : row);
  }
  const file = path.join(dir, name);
  writeFileSync(file, lines.join(layout.newline) + layout.newline);
  return file;
}

const LAYOUTS: Record<string, Layout> = {
  "comma, point, time column, LF": {
    delimiter: ",",
    decimal: ".",
    newline: "\n",
    preamble: [],
    header: ["Time (s)", "V_AB (V)", "V_BC (V)", "V_CA (V)"],
    time: true,
  },
  "semicolon, decimal comma, preamble, BOM, CRLF, trailing delimiter": {
    delimiter: ";",
    decimal: ",",
    newline: "\r\n",
    preamble: ["\uFEFFInstrument;Invented DAQ 8", "Sample Interval;0,0001 s", ""],
    header: ["Time [ms]", "V_AN [V]", "V_BN [V]", "I_A [mA]"],
    time: true,
    trailing: true,
  },
  "semicolon, point, no units (assumed-unit warnings)": {
    delimiter: ";",
    decimal: ".",
    newline: "\n",
    preamble: [],
    header: ["t", "ch1", "ch2"],
    time: true,
  },
  "no time column, rate in the preamble, kV": {
    delimiter: ",",
    decimal: ".",
    newline: "\n",
    preamble: ["# Sampling rate: 10 kHz", "# Trigger position: 0", "# CH2 Probe: 10:1"],
    header: ["CH1 [kV]", "CH2 [kV]"],
    time: false,
  },
  "tab, CRLF, time column": {
    delimiter: "\t",
    decimal: ".",
    newline: "\r\n",
    preamble: [],
    header: ["Time (s)", "V_A (V)", "V_B (V)", "V_C (V)"],
    time: true,
  },
};

type Outcome = { capture: ParsedCapture } | { error: { name: string; message: string; code?: string; line?: number; column?: string } };

async function read(file: string, options: ParseOptions, ingest: ParallelIngestOptions): Promise<Outcome> {
  try {
    return { capture: await readCaptureFile(file, options, ingest) };
  } catch (error) {
    const e = error as { name: string; message: string; code?: string; line?: number; column?: string };
    return { error: { name: e.name, message: e.message, code: e.code, line: e.line, column: e.column } };
  }
}

function bitsOf(samples: Float64Array): Uint8Array {
  return new Uint8Array(samples.buffer, samples.byteOffset, samples.byteLength);
}

/** Reads `file` on the single pass and on two threads (split in the middle) and compares all. */
async function compare(file: string, options: ParseOptions = {}): Promise<{ single: Outcome; parallel: Outcome; path: string; reason?: string }> {
  const single = await read(file, options, { parallel: "never" });
  let taken: { path: string; reason?: string } = { path: "none" };
  const parallel = await read(file, options, { parallel: "always", waitForWorker: true, onPath: (outcome) => (taken = outcome) });
  if ("error" in single) {
    expect("error" in parallel ? parallel.error : "no rejection").toEqual(single.error);
  } else {
    expect("capture" in parallel).toBe(true);
    const a = single.capture;
    const b = (parallel as { capture: ParsedCapture }).capture;
    expect({ ...b, channels: b.channels.map(({ id, unit }) => ({ id, unit })) }).toEqual({ ...a, channels: a.channels.map(({ id, unit }) => ({ id, unit })) });
    expect(Object.is(b.timeStartS, a.timeStartS)).toBe(true);
    a.channels.forEach((channel, index) => {
      const other = b.channels[index]!.samples;
      expect(other.length).toBe(channel.samples.length);
      // Bit for bit (NaN payloads, −0 included), not merely ==.
      expect(Buffer.compare(bitsOf(other), bitsOf(channel.samples))).toBe(0);
    });
  }
  return { single, parallel, ...taken };
}

describe("readCaptureFile on two threads", () => {
  for (const [name, layout] of Object.entries(LAYOUTS)) {
    it(`${name}: same samples, rate, metadata and warnings as the single pass, on the two-thread path`, async () => {
      const file = writeCapture(`${name.replace(/[^a-z]+/gi, "-")}.csv`, layout);
      const { single, path: taken, reason } = await compare(file);
      expect("capture" in single).toBe(true);
      expect({ taken, reason }).toEqual({ taken: "parallel", reason: undefined });
    });
  }

  it("calibration (scale and offset per column) is applied identically", async () => {
    const file = writeCapture("calibrated.csv", LAYOUTS["comma, point, time column, LF"]!);
    const { path: taken } = await compare(file, { calibration: { "V_AB (V)": { scale: 100.1, offset: -0.3 }, "V_CA (V)": { scale: 3 } } });
    expect(taken).toBe("parallel");
  });

  it("an irregular time step in the second half is rejected naming its true file line", async () => {
    // Row 110000 is missing: the step to row 110001 (file line 110002; header is line 1) is twice the others.
    const file = writeCapture("irregular.csv", LAYOUTS["comma, point, time column, LF"]!, (row, cells) => (row === 110_000 ? null : cells));
    const { single, path: taken } = await compare(file);
    expect("error" in single && single.error.code).toBe("irregular-time");
    expect("error" in single && single.error.line).toBe(110_002);
    expect(taken).toBe("parallel");
  });

  it("uneven sampling in the second half warns with the true file line", async () => {
    const file = writeCapture("uneven.csv", LAYOUTS["semicolon, decimal comma, preamble, BOM, CRLF, trailing delimiter"]!, (row, cells) =>
      row === 130_000 ? [(row / 10_000 + 0.00002).toFixed(5), ...cells.slice(1)] : cells,
    );
    const { single, path: taken } = await compare(file);
    expect("capture" in single && single.capture.warnings.map((w) => w.message).join()).toMatch(/worst at line 13000[56]\)/);
    expect(taken).toBe("parallel");
  });

  const rejections: [string, (row: number, cells: string[]) => string[] | null, string][] = [
    ["a non-numeric cell", (row, cells) => (row === 120_000 ? [cells[0]!, "12.5x", ...cells.slice(2)] : cells), "non-numeric"],
    ["a value beyond the last column", (row, cells) => (row === 120_000 ? [...cells, "1.0"] : cells), "unexpected-field"],
    ["a time stamp that goes back", (row, cells) => (row === 120_000 ? ["0.00001", ...cells.slice(1)] : cells), "time-not-increasing"],
    ["an empty cell followed by values", (row, cells) => (row === 120_000 ? [cells[0]!, "", ...cells.slice(2)] : cells), "missing-value"],
    ["a column that stops early", (row, cells) => (row >= 149_000 ? cells.slice(0, 3) : cells), "unequal-length"],
  ];
  for (const [what, edit, code] of rejections) {
    it(`${what} in the second half: the same rejection and file line as the single pass`, async () => {
      const file = writeCapture(`${code}.csv`, LAYOUTS["comma, point, time column, LF"]!, edit);
      const { single, reason } = await compare(file);
      expect("error" in single && single.error.code).toBe(code);
      expect("error" in single && single.error.line).toBeGreaterThan(120_000);
      // The two-thread path gave way to the single pass, which named the line.
      expect(reason).toMatch(/^(rejection|empty cell|time not increasing)/);
    });
  }

  it("a rejection in the first half is the single pass's", async () => {
    const file = writeCapture("early.csv", LAYOUTS["tab, CRLF, time column"]!, (row, cells) => (row === 20_000 ? [cells[0]!, "n/a", ...cells.slice(2)] : cells));
    const { single } = await compare(file);
    expect("error" in single && single.error.line).toBe(20_002);
  });

  it("a blank line and a file without a final newline", async () => {
    const file = writeCapture("blank.csv", LAYOUTS["comma, point, time column, LF"]!, (row, cells) => (row === 100_000 ? [`\n${cells[0]}`, ...cells.slice(1)] : cells));
    writeFileSync(file, `${(await import("node:fs")).readFileSync(file, "utf8").trimEnd()}`);
    const { single, path: taken } = await compare(file);
    expect("capture" in single && single.capture.sampleCount).toBe(ROWS);
    expect(taken).toBe("parallel");
  });
});
