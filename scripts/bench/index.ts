/**
 * npm run bench [-- --sizes 1e5,1e6,1e7] [--repeat 3]
 * Generates 3-channel captures into bench-out/, then for each file runs the TypeScript engine and
 * the pandas + numpy equivalent in separate child processes (so peak RSS is per file) and prints
 * time, throughput, peak RSS and the time ratio (each the median of --repeat runs). It reports;
 * it does not pass or fail.
 * Other sections (e.g. a worker pipeline run) can reuse `runEngine`, `formatRow` and `printTable`.
 */
import { execFileSync, spawnSync } from "node:child_process";
import { mkdirSync, writeFileSync } from "node:fs";
import { availableParallelism, loadavg } from "node:os";
import path from "node:path";
import { ensureBenchCapture } from "./generate";
import { printTable } from "./table";

export { printTable } from "./table";

const ROOT = path.resolve(import.meta.dirname, "../..");
const OUT = path.join(ROOT, "bench-out");
const PYTHON = "/usr/bin/python3";
/** The targets for the 1e7-row file. */
const TARGET_RATIO = 0.35;
const TARGET_RSS_MB = 500;

export interface Measurement {
  ingestS: number;
  analyseS: number;
  totalS: number;
  peakRssMb: number;
  /** Engine only: which ingestion read the file ("parallel" or "single"). */
  ingestPath?: string;
  frequencyHz: number;
  thdFPercent: number | null;
  rms: number | null;
  deviationFactorPercent: number | null;
  vufPercent: number | null;
}

function runJson(command: string, args: string[]): Measurement {
  const result = spawnSync(command, args, { cwd: ROOT, encoding: "utf8", maxBuffer: 1 << 20 });
  if (result.status !== 0) throw new Error(`${command} ${args.join(" ")} failed: ${result.stderr}`);
  const lastLine = result.stdout.trim().split("\n").pop() ?? "";
  return JSON.parse(lastLine) as Measurement;
}

/** `parallel`: "never" = single-thread ingestion, "always" = two threads (worker_threads). */
export function runEngine(file: string, parallel: "auto" | "always" | "never" = "auto"): Measurement {
  return runJson(process.execPath, ["--import", "tsx", path.join(ROOT, "scripts/bench/measure-capture.ts"), file, parallel]);
}

function pandasAvailable(): string | null {
  try {
    execFileSync(PYTHON, ["-c", "import pandas, numpy"], { stdio: "ignore" });
    return null;
  } catch {
    return `pandas + numpy not importable by ${PYTHON}: comparison skipped`;
  }
}

export function runPandas(file: string): Measurement {
  return runJson(PYTHON, [path.join(ROOT, "scripts/bench/pandas_equivalent.py"), file]);
}

const seconds = (value: number): string => value.toFixed(2);

export function formatRow(label: string, sizeBytes: number, m: Measurement): string[] {
  return [label, seconds(m.ingestS), seconds(m.analyseS), seconds(m.totalS), (sizeBytes / 1e6 / m.totalS).toFixed(0), m.peakRssMb.toFixed(0)];
}

/** The run with the median total of `repeats` runs: one noisy run on a shared machine says little. */
function medianRun(repeats: number, run: () => Measurement): Measurement {
  return median(Array.from({ length: repeats }, run));
}

function median(runs: Measurement[]): Measurement {
  const sorted = [...runs].sort((a, b) => a.totalS - b.totalS);
  return sorted[Math.floor((sorted.length - 1) / 2)] as Measurement;
}

function parseRepeats(argv: string[]): number {
  const index = argv.indexOf("--repeat");
  const value = index >= 0 ? Number(argv[index + 1]) : 3;
  return Number.isInteger(value) && value > 0 ? value : 3;
}

function parseSizes(argv: string[]): number[] {
  const index = argv.indexOf("--sizes");
  const list = index >= 0 ? (argv[index + 1] ?? "") : "1e5,1e6,1e7";
  return list.split(",").map((item) => Number(item)).filter((value) => Number.isInteger(value) && value > 0);
}

function main(): void {
  mkdirSync(OUT, { recursive: true });
  const skipped = pandasAvailable();
  const repeats = parseRepeats(process.argv.slice(2));
  const rows: string[][] = [["file", "ingest s", "analyse s", "total s", "MB/s", "peak RSS MB"]];
  const ratios: string[][] = [
    ["rows", "MB", "1-thread s", "2-thread s", "pandas s", "ratio 1-thr", "ratio 2-thr", "RSS 1-thr", "RSS 2-thr", "pandas RSS", "target (1e7, 2-thread)"],
  ];
  const agreement: string[][] = [["rows", "Δf ppm", "ΔTHD-F pp", "ΔRMS %", "Δdeviation pp", "ΔVUF pp"]];
  const gap = (a: number | null, b: number | null, scale = 1, digits = 5): string => (a === null || b === null ? "—" : (scale * (a - b)).toFixed(digits));
  const results: Record<string, unknown>[] = [];
  for (const count of parseSizes(process.argv.slice(2))) {
    const file = path.join(OUT, `capture-${count.toExponential().replace("+", "")}.csv`);
    const size = ensureBenchCapture(file, count);
    const label = `${count.toExponential(0)} rows (${(size / 1e6).toFixed(0)} MB)`;
    // Interleaved, so load drifting on a shared machine hits both ingestions alike.
    const singleRuns: Measurement[] = [];
    const engine = medianRun(repeats, () => {
      singleRuns.push(runEngine(file, "never"));
      return runEngine(file, "always");
    });
    const single = median(singleRuns);
    rows.push(formatRow(`engine 1-thread ${label}`, size, single));
    rows.push(formatRow(`engine 2-thread${engine.ingestPath === "parallel" ? "" : " (fell back)"} ${label}`, size, engine));
    const pandas = skipped ? null : medianRun(repeats, () => runPandas(file));
    if (pandas) rows.push(formatRow(`pandas ${label}`, size, pandas));
    const ratio = pandas ? engine.totalS / pandas.totalS : null;
    const singleRatio = pandas ? single.totalS / pandas.totalS : null;
    const target = count >= 1e7 ? `${ratio !== null && ratio <= TARGET_RATIO ? "met" : "missed"} ≤${TARGET_RATIO}×, ${engine.peakRssMb < TARGET_RSS_MB ? "met" : "missed"} <${TARGET_RSS_MB} MB` : "";
    ratios.push([
      count.toExponential(0),
      (size / 1e6).toFixed(0),
      seconds(single.totalS),
      seconds(engine.totalS),
      pandas ? seconds(pandas.totalS) : "—",
      singleRatio !== null ? `${singleRatio.toFixed(2)}×` : "—",
      ratio !== null ? `${ratio.toFixed(2)}×` : "—",
      single.peakRssMb.toFixed(0),
      engine.peakRssMb.toFixed(0),
      pandas ? pandas.peakRssMb.toFixed(0) : "—",
      target,
    ]);
    if (pandas) {
      agreement.push([
        count.toExponential(0),
        gap(engine.frequencyHz, pandas.frequencyHz, 1e6 / pandas.frequencyHz, 4),
        gap(engine.thdFPercent, pandas.thdFPercent),
        gap(engine.rms, pandas.rms, 100 / (pandas.rms ?? 1)),
        gap(engine.deviationFactorPercent, pandas.deviationFactorPercent),
        gap(engine.vufPercent, pandas.vufPercent),
      ]);
    }
    results.push({ rows: count, bytes: size, engine, engineSingleThread: single, pandas });
  }
  printTable(`Ingestion + analysis, one child process per run, median of ${repeats}`, rows);
  printTable("Engine against pandas + numpy (same files, same run)", ratios);
  if (!skipped) printTable("Agreement, engine minus pandas + numpy (first channel)", agreement);
  if (skipped) console.log(`\nNote: ${skipped}`);
  // Timings on a shared machine move with its load: print it so a run can be judged.
  console.log(`\n${availableParallelism()} cores; load average at the end ${loadavg().map((value) => value.toFixed(2)).join(" / ")} (1, 5, 15 min)`);
  writeFileSync(path.join(OUT, "results.json"), `${JSON.stringify(results, null, 2)}\n`);
}

if (import.meta.url === `file://${process.argv[1]}`) main();
