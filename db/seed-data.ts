// The demo scenario. Every company, person, place and serial here is invented.
import type { CheckId, PresetId, Rating } from "@/lib/analysis";

export const DEMO_PASSWORD = "bench-demo-2026";

export const demoOrganisations = [
  { slug: "harrowgate-lab", name: "Harrowgate Rotating Machines Lab", kind: "lab", address: "Unit 4, Fellside Works, Harrowgate HG9 2QT", contactEmail: "lab@harrowgate.example", referenceCode: "" },
  { slug: "kestrum", name: "Kestrum Generators", kind: "manufacturer", address: "12 Brindle Quay, Portmarren PM3 8LW", contactEmail: "quality@kestrum.example", referenceCode: "KST-0042" },
  { slug: "poldane", name: "Poldane Motion Works", kind: "manufacturer", address: "Poldane Business Park, Ostley OS4 1DN", contactEmail: "tests@poldane.example", referenceCode: "PMW/SUP/117" },
] as const;

export const demoUsers = [
  { email: "maren.ilsley@harrowgate.example", name: "Maren Ilsley", role: "admin", org: "harrowgate-lab" },
  { email: "tobiah.crane@harrowgate.example", name: "Tobiah Crane", role: "operator", org: "harrowgate-lab" },
  { email: "ines.vardy@harrowgate.example", name: "Ines Vardy", role: "qa", org: "harrowgate-lab" },
  { email: "ruan.petit@kestrum.example", name: "Ruan Petit", role: "manufacturer", org: "kestrum" },
  { email: "sela.ambrose@poldane.example", name: "Sela Ambrose", role: "manufacturer", org: "poldane" },
] as const;

export const demoStations = [
  { name: "Bay 1 · 90 kW drive stand", location: "Harrowgate, north hall" },
  { name: "Bay 3 · PM spin rig", location: "Harrowgate, clean room" },
] as const;

type DemoStep = { name: string; testKind: "no-load" | "load" | "back-emf"; speedRpm: number; windowPercent: number; roles: string[]; checks: CheckId[] };

const ALTERNATOR_NO_LOAD: CheckId[] = ["voltage", "frequency", "thd", "individual-harmonic", "voltage-unbalance", "phase-displacement", "phase-sequence", "deviation-factor", "thf", "tif", "pole-count"];
const PM_BACK_EMF: CheckId[] = ["back-emf-constant", "frequency", "thd", "voltage-unbalance", "phase-displacement", "phase-sequence", "pole-count"];
const LL3 = ["vab", "vbc", "vca"];

/** Each rating starts from a preset; the plan is what a unit of it must pass to be complete. */
export const demoRatings: ReadonlyArray<{ org: string; modelCode: string; title: string; preset: PresetId; nameplate: Rating; plan: DemoStep[] }> = [
  {
    org: "kestrum", modelCode: "KG-45T", title: "45 kVA three-phase alternator, 400 V 50 Hz", preset: "iec-60034-1",
    nameplate: { machineKind: "wound-field-alternator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1500, ratedKva: 45 },
    plan: [{ name: "Open circuit at rated speed", testKind: "no-load", speedRpm: 1500, windowPercent: 2, roles: LL3, checks: ALTERNATOR_NO_LOAD }],
  },
  {
    org: "kestrum", modelCode: "KG-60T6", title: "60 kVA three-phase alternator, 480 V 60 Hz", preset: "nema-mg-1",
    nameplate: { machineKind: "wound-field-alternator", nominalVoltageV: 480, voltageBasis: "line-line-rms", frequencyHz: 60, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1800, ratedKva: 60 },
    plan: [{ name: "Open circuit at rated speed", testKind: "no-load", speedRpm: 1800, windowPercent: 2, roles: LL3, checks: ALTERNATOR_NO_LOAD }],
  },
  {
    org: "kestrum", modelCode: "KS-8", title: "8 kVA single-phase alternator, 230 V 50 Hz", preset: "lab-own",
    nameplate: { machineKind: "wound-field-alternator", nominalVoltageV: 230, voltageBasis: "line-neutral-rms", frequencyHz: 50, phases: 1, connection: "single", poles: 2, ratedSpeedRpm: 3000, ratedKva: 8 },
    plan: [{ name: "Open circuit at rated speed", testKind: "no-load", speedRpm: 3000, windowPercent: 2, roles: ["v"], checks: ["voltage", "frequency", "thd", "individual-harmonic", "deviation-factor", "pole-count"] }],
  },
  {
    org: "poldane", modelCode: "PX-120", title: "PM servo generator, Ke 120 V/krpm, 8 poles", preset: "lab-own",
    nameplate: {
      machineKind: "pm-generator", nominalVoltageV: 360, voltageBasis: "line-line-rms", frequencyHz: 200, phases: 3, connection: "star", poles: 8, ratedSpeedRpm: 3000,
      ratedKw: 4.5, ke: { value: 120, basis: "line-line-rms-per-krpm" }, magnetMaterial: "ndfeb", magnetReferenceC: 20,
    },
    plan: [1000, 2000, 3000].map((speedRpm) => ({ name: `Back-EMF at ${speedRpm} rpm`, testKind: "back-emf" as const, speedRpm, windowPercent: 2, roles: LL3, checks: PM_BACK_EMF })),
  },
];

/** 44 units: serials follow each maker's invented scheme; KG-45T's 28 give its trends enough points for capability. */
export const demoUnits: ReadonlyArray<{ serial: string; modelCode: string }> = [
  ...Array.from({ length: 28 }, (_, i) => ({ serial: `KG45-26${String(301 + i).padStart(4, "0")}`, modelCode: "KG-45T" })),
  ...Array.from({ length: 5 }, (_, i) => ({ serial: `KG60-26${String(41 + i).padStart(4, "0")}`, modelCode: "KG-60T6" })),
  ...Array.from({ length: 3 }, (_, i) => ({ serial: `KS8-2611${String(7 + i).padStart(2, "0")}`, modelCode: "KS-8" })),
  ...Array.from({ length: 8 }, (_, i) => ({ serial: `PX120-B${String(1021 + i)}`, modelCode: "PX-120" })),
];

/**
 * A second, smaller lab so that isolation between labs is exercised: its own people and bench, one
 * client (Kestrum) shared with Harrowgate, its own rating for that client and its own units.
 */
export const secondLab = {
  organisation: { slug: "calderwick-lab", name: "Calderwick Machine Test House", kind: "lab", address: "Dock Road 7, Calderwick CW2 5RP", contactEmail: "bench@calderwick.example", referenceCode: "" },
  clients: ["kestrum"],
  users: [
    { email: "odile.fenner@calderwick.example", name: "Odile Fenner", role: "admin" },
    { email: "jory.haskett@calderwick.example", name: "Jory Haskett", role: "operator" },
    { email: "wren.obuya@calderwick.example", name: "Wren Obuya", role: "qa" },
  ],
  stations: [{ name: "Cell A · 55 kW dyno", location: "Calderwick, test cell A" }],
  rating: { org: "kestrum", modelCode: "KG-45T", basedOn: "KG-45T" },
  units: ["KG45-CW0001", "KG45-CW0002", "KG45-CW0003"],
} as const;

/**
 * Harrowgate's instrument register (invented makes, models and serials). Dates are days from the day the
 * seed runs: one tachometer is overdue (and took some PX-120 captures), one probe falls due within 14 days.
 * `benches` names the bench default sets (demoStations) the instrument belongs to.
 */
export const demoInstruments = [
  { assetTag: "HG-OSC-07", kind: "oscilloscope", make: "Tessary", model: "WX-4104", serial: "TW4104-55817", spec: { gainPercentOfReading: 1.5, offset: 0.05, offsetUnit: "V", bandwidthHz: 200e6, timebasePpm: 25, resolutionBits: 12 }, calibratedDaysAgo: 120, dueInDays: 245, benches: [0, 1] },
  { assetTag: "HG-VP-21", kind: "voltage-probe", make: "Orlen Instruments", model: "HDP-1500", serial: "OI-HDP-30418", spec: { gainPercentOfReading: 1, bandwidthHz: 100e6 }, calibratedDaysAgo: 355, dueInDays: 10, benches: [0] },
  { assetTag: "HG-VP-22", kind: "voltage-probe", make: "Orlen Instruments", model: "HDP-1500", serial: "OI-HDP-30422", spec: { gainPercentOfReading: 1, bandwidthHz: 100e6 }, calibratedDaysAgo: 60, dueInDays: 305, benches: [1] },
  { assetTag: "HG-DAQ-03", kind: "daq", make: "Marrow Data", model: "MD-816", serial: "MD816-002291", spec: { gainPercentOfReading: 0.1, offset: 0.002, offsetUnit: "V", timebasePpm: 50, resolutionBits: 16 }, calibratedDaysAgo: 30, dueInDays: 335, benches: [] },
  { assetTag: "HG-TAC-11", kind: "tachometer", make: "Quillon", model: "OT-90", serial: "QOT90-7741", spec: { speedPercentOfReading: 0.02, speedOffsetRpm: 1 }, calibratedDaysAgo: 385, dueInDays: -20, benches: [] },
  { assetTag: "HG-TAC-12", kind: "tachometer", make: "Quillon", model: "OT-90", serial: "QOT90-7802", spec: { speedPercentOfReading: 0.02, speedOffsetRpm: 1 }, calibratedDaysAgo: 40, dueInDays: 325, benches: [1] },
] as const;

/** PX-120 units whose demo captures were taken with the overdue tachometer (they carry the warning). */
export const overdueInstrumentUnits = ["PX120-B1021", "PX120-B1022"] as const;
export const OVERDUE_DEMO_TACHOMETER = "HG-TAC-11";
