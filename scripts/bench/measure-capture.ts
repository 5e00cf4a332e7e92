/**
 * Child process of the benchmark: ingests and analyses one capture, then prints one JSON line.
 * Run in its own process so the peak RSS (getrusage maxrss) belongs to this file alone. The second
 * argument picks the ingestion: "never" is the single pass, "auto" the default (two threads from
 * 64 MiB), "always" two threads for any file over 2 MiB.
 */
import { analyseCapture } from "@/lib/analysis";
import { readCaptureFile } from "@/lib/server/capture-reader";

const path = process.argv[2];
const parallel = process.argv[3] ?? "auto";
if (!path || !["auto", "always", "never"].includes(parallel)) throw new Error("usage: measure-capture.ts <capture.csv> [auto|always|never]");
const start = performance.now();
let ingestPath = "single";
const capture = await readCaptureFile(path, {}, { parallel: parallel as "auto" | "always" | "never", onPath: (outcome) => (ingestPath = outcome.path) });
const ingested = performance.now();
const report = analyseCapture(capture, { channelRoles: { "V_AB (V)": "vab", "V_BC (V)": "vbc", "V_CA (V)": "vca" } });
const done = performance.now();
process.stdout.write(
  `${JSON.stringify({
    ingestS: (ingested - start) / 1000,
    analyseS: (done - ingested) / 1000,
    totalS: (done - start) / 1000,
    ingestPath,
    peakRssMb: process.resourceUsage().maxRSS / 1024,
    cpuS: (process.resourceUsage().userCPUTime + process.resourceUsage().systemCPUTime) / 1e6,
    frequencyHz: report.frequencyHz,
    thdFPercent: report.channels[0]?.thdFPercent ?? null,
    rms: report.channels[0]?.rms ?? null,
    deviationFactorPercent: report.channels[0]?.deviationFactorPercent ?? null,
    vufPercent: report.threePhase?.unbalance.vufPercent ?? null,
  })}\n`,
);
