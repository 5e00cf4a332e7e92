import type { DemoWave } from "./waveforms";

// Which demo units get a capture, and what their invented machines do on the bench.
export type DemoCapture = {
  serial: string;
  testKind: "no-load" | "back-emf";
  speedRpm: number;
  roles: Record<string, string>;
  wave: Omit<DemoWave, "seed">;
  notes: string;
};

const LL3 = { "V_AB (V)": "vab", "V_BC (V)": "vbc", "V_CA (V)": "vca" };
const healthy = { 5: 0.9, 7: 0.6, 11: 0.3 };

function kg45(i: number, extra: Partial<DemoWave> = {}, notes = "Open-circuit at rated speed."): DemoCapture {
  return {
    serial: `KG45-26${String(301 + i).padStart(4, "0")}`, testKind: "no-load", speedRpm: 1500, roles: LL3, notes,
    wave: { lineVoltsRms: 400 * (1 + ((i % 3) - 1) * 0.004), frequencyHz: 50, phases: 3, harmonicsPercent: healthy, ...extra },
  };
}

/**
 * The KG-45T production run behind the trends page: units 311–328 with a little unit-to-unit spread
 * in voltage and in the 5th and 7th harmonics (seeded, so every fresh demo draws the same chart).
 */
function kg45Run(i: number): DemoCapture {
  const lineVoltsRms = 400 * (1 + 0.005 * Math.sin(i * 2.3) + 0.002 * Math.cos(i * 0.7));
  return kg45(i, { lineVoltsRms, harmonicsPercent: { 5: 0.9 + 0.12 * Math.sin(i * 1.3), 7: 0.6 + 0.05 * Math.cos(i * 1.9), 11: 0.3 } }, "Open-circuit at rated speed, production run.");
}

/** 8 poles: f = p·n/120; Ke 120 V/krpm line-line RMS on the nameplate. */
function px120(unit: number, speedRpm: number, keFactor: number, notes: string): DemoCapture {
  return {
    serial: `PX120-B${1021 + unit}`, testKind: "back-emf", speedRpm, roles: LL3, notes,
    wave: { lineVoltsRms: 0.12 * speedRpm * keFactor, frequencyHz: (8 * speedRpm) / 120, phases: 3, harmonicsPercent: { 5: 1.8, 7: 0.9 }, sampleRateHz: 20_000 * Math.max(1, speedRpm / 1000) },
  };
}

// Complete and within, failing, inconclusive (a clipped input; a 100:1 probe recorded at 1:1) and
// incomplete units, across the four ratings.
export const demoCaptures: DemoCapture[] = [
  kg45(0), kg45(1), kg45(2),
  kg45(3, { harmonicsPercent: { 3: 0.5, 5: 4.6, 7: 3.4, 11: 1.2 } }, "Open-circuit; rotor from the second supplier batch."),
  kg45(4), kg45(5),
  kg45(6, { phaseScale: [1, 0.985, 1.006] }, "Open-circuit after stator rewind."),
  kg45(7, { harmonicsPercent: { 5: 1.1, 7: 0.8 } }, "Open-circuit; new lamination supplier."),
  kg45(8, { clipAtPercent: 92 }, "Open-circuit; scope range set one step too low."),
  ...Array.from({ length: 18 }, (_, k) => kg45Run(10 + k)),
  ...[0, 1, 2].map((i): DemoCapture => ({
    serial: `KG60-26${String(41 + i).padStart(4, "0")}`, testKind: "no-load", speedRpm: 1800, roles: LL3, notes: "Open-circuit, 60 Hz build.",
    wave: { lineVoltsRms: 480 * (1 - i * 0.003), frequencyHz: 60, phases: 3, harmonicsPercent: healthy },
  })),
  {
    serial: "KG60-260044", testKind: "no-load", speedRpm: 1800, roles: LL3, notes: "Open-circuit, 60 Hz build; 100:1 probes on this bench today.",
    wave: { lineVoltsRms: 480, frequencyHz: 60, phases: 3, harmonicsPercent: healthy, recordedScale: 0.01 },
  },
  {
    serial: "KS8-261107", testKind: "no-load", speedRpm: 3000, roles: { "V_OUT (V)": "v" }, notes: "Single-phase, open-circuit.",
    wave: { lineVoltsRms: 231, frequencyHz: 50, phases: 1, harmonicsPercent: { 3: 0.9, 5: 0.6 } },
  },
  ...[1000, 2000, 3000].flatMap((speed) => [
    px120(0, speed, 1.002, `Back-EMF spin test at ${speed} rpm, magnets at 21 °C.`),
    px120(1, speed, 0.996, `Back-EMF spin test at ${speed} rpm, magnets at 22 °C.`),
  ]),
  px120(2, 1000, 1.004, "Back-EMF spin test at 1000 rpm; the higher speeds are booked for next week."),
  px120(3, 1000, 0.93, "Back-EMF spin test; rotor returned from the field after an over-temperature event."),
  px120(4, 1000, 0.998, "Back-EMF spin test at 1000 rpm, magnets at 23 °C."),
];
