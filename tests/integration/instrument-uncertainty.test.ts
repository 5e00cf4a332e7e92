import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getCurrentAnalysis } from "@/db/queries/analyses";
import type { AnalysisReport } from "@/lib/analysis";
import { createInstrument } from "@/lib/dal/instruments";
import { addDays, utcDay } from "@/lib/instruments/status";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, demoActor, demoLabStation, startWorker, uploadViaApi, waitForState, type WorkerProcess } from "./pipeline-support";

// The worker hands the capture's instruments to the engine: a capture with a scope (gain ±1.5 % of
// reading, offset ±0.05 V, timebase ±25 ppm) and a probe (±1 % of reading) carries U for voltage and
// frequency; one without instruments says "not evaluated". Expected U by GUM type B (JCGM 100:2008),
// rectangular: U = 2·√(((0.015·V)² + 0.05² + (0.01·V)²)/3) and U_f = 2·(25e-6·f)/√3 (hand).

const run = `${Date.now() % 1_000_000}`;
let labId: string;
let token: string;
let worker: WorkerProcess;

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
  const admin = await demoActor("admin");
  const today = utcDay(new Date());
  const dates = { calibratedOn: addDays(today, -30), calibrationDue: addDays(today, 300), calibrationNote: "" };
  await createInstrument(admin, { kind: "oscilloscope", make: "Fenwick Metrology", model: "FM-S1", serial: `S-${run}`, assetTag: `U-OSC-${run}`, spec: { gainPercentOfReading: 1.5, offset: 0.05, offsetUnit: "V", timebasePpm: 25 }, ...dates });
  await createInstrument(admin, { kind: "voltage-probe", make: "Fenwick Metrology", model: "FM-P1", serial: `P-${run}`, assetTag: `U-VP-${run}`, spec: { gainPercentOfReading: 1 }, ...dates });
  worker = await startWorker();
}, 60_000);
afterAll(async () => {
  await worker?.stop();
  await closeConnections();
});

async function analysed(csv: string, meta: Record<string, unknown>): Promise<AnalysisReport> {
  const { id } = await uploadViaApi(token, csv, meta);
  const capture = await waitForState(labId, id, ["analysed", "rejected", "failed"]);
  expect(capture.state, capture.stateMessage ?? "").toBe("analysed");
  return (await getCurrentAnalysis({ kind: "lab", labId }, id))?.report as AnalysisReport;
}

describe("the worker's uncertainty input", () => {
  it("analyseCapture in the worker gives U for voltage and frequency from the capture's instruments (hand formula above)", async () => {
    const report = await analysed(makeThreePhaseCsv({ variant: Number(run) % 997 }), { unitSerial: "KG45-260302", speedRpm: 1500, instruments: [`U-OSC-${run}`, `U-VP-${run}`] });
    const voltage = report.verdicts.find((v) => v.check === "voltage")!;
    const v = voltage.measured as number;
    const expected = 2 * Math.sqrt(((0.015 * v) ** 2 + 0.05 ** 2 + (0.01 * v) ** 2) / 3);
    expect(Math.abs((voltage.expandedUncertainty ?? 0) - expected) / expected).toBeLessThan(1e-9);
    const f = report.uncertainty?.figures.find((x) => x.check === "frequency");
    expect(f?.status).toBe("evaluated");
    if (f?.status === "evaluated") expect(f.expandedUncertainty).toBeCloseTo((2 * 25e-6 * report.frequencyHz) / Math.sqrt(3), 12);
    expect(report.uncertainty?.instruments.map((i) => i.assetTag).sort()).toEqual([`U-OSC-${run}`, `U-VP-${run}`].sort());
    expect(report.analysisVersion).toBe("2.2.0");
  }, 90_000);

  it("analyseCapture in the worker says not evaluated (never zero) for a capture without instruments", async () => {
    const report = await analysed(makeThreePhaseCsv({ variant: (Number(run) % 997) + 1 }), { unitSerial: "KG45-260303", speedRpm: 1500, instruments: [] });
    expect(report.uncertainty?.figures.map((x) => x.status)).toEqual(["not-evaluated", "not-evaluated", "not-evaluated"]);
    expect(report.verdicts.find((v) => v.check === "voltage")?.expandedUncertainty).toBeNull();
  }, 90_000);
});
