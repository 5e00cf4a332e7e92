// The demo scenario. Every company, person, place and serial here is invented.

export const DEMO_PASSWORD = "bench-demo-2026";

export const demoOrganisations = [
  { slug: "harrowgate-lab", name: "Harrowgate Rotating Machines Lab", kind: "lab" },
  { slug: "kestrum", name: "Kestrum Generators", kind: "manufacturer" },
  { slug: "poldane", name: "Poldane Motion Works", kind: "manufacturer" },
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

export const demoRatings = [
  {
    org: "kestrum", modelCode: "KG-45T", title: "45 kVA three-phase alternator, 400 V 50 Hz",
    nameplate: { nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1500, ratedKva: 45 },
  },
  {
    org: "kestrum", modelCode: "KG-60T6", title: "60 kVA three-phase alternator, 480 V 60 Hz",
    nameplate: { nominalVoltageV: 480, voltageBasis: "line-line-rms", frequencyHz: 60, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1800, ratedKva: 60 },
  },
  {
    org: "kestrum", modelCode: "KS-8", title: "8 kVA single-phase alternator, 230 V 50 Hz",
    nameplate: { nominalVoltageV: 230, voltageBasis: "line-neutral-rms", frequencyHz: 50, phases: 1, connection: "single", poles: 2, ratedSpeedRpm: 3000, ratedKva: 8 },
  },
  {
    org: "poldane", modelCode: "PX-120", title: "PM servo generator, Ke 120 V/krpm, 8 poles",
    nameplate: { nominalVoltageV: 360, voltageBasis: "line-line-rms", frequencyHz: 200, phases: 3, connection: "star", poles: 8, ratedSpeedRpm: 3000, keLineRmsPerKrpm: 120 },
  },
] as const;

/** 26 units: serials follow each maker's invented scheme. */
export const demoUnits: ReadonlyArray<{ serial: string; modelCode: string }> = [
  ...Array.from({ length: 10 }, (_, i) => ({ serial: `KG45-26${String(301 + i).padStart(4, "0")}`, modelCode: "KG-45T" })),
  ...Array.from({ length: 5 }, (_, i) => ({ serial: `KG60-26${String(41 + i).padStart(4, "0")}`, modelCode: "KG-60T6" })),
  ...Array.from({ length: 3 }, (_, i) => ({ serial: `KS8-2611${String(7 + i).padStart(2, "0")}`, modelCode: "KS-8" })),
  ...Array.from({ length: 8 }, (_, i) => ({ serial: `PX120-B${String(1021 + i)}`, modelCode: "PX-120" })),
];
