import { closeDb } from "@/db/queries/connection";
import { insertDemoScenario } from "@/db/queries/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { hashPassword } from "@/lib/auth/password";
import { tolerancePresets } from "@/lib/analysis";

// PM machines start from the back-EMF bench preset, alternators from the open-circuit waveform one;
// a lab manager edits the copy per rating later.
function defaultToleranceFor(nameplate: unknown) {
  const isPm = typeof nameplate === "object" && nameplate !== null && "keLineRmsPerKrpm" in nameplate;
  const wanted = isPm ? "pm-back-emf-bench" : "open-circuit-waveform";
  const preset = tolerancePresets.find((p) => p.id === wanted) ?? tolerancePresets[0];
  if (!preset) throw new Error("no tolerance preset is shipped");
  return structuredClone(preset);
}

try {
  const inserted = await insertDemoScenario(await hashPassword(DEMO_PASSWORD), defaultToleranceFor);
  console.log(inserted ? "demo scenario seeded" : "demo scenario already present: nothing changed");
} catch (err) {
  console.error(`seeding failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
