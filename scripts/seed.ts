import { closeDb } from "@/db/client";
import { insertDemoScenario } from "@/db/queries/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { hashPassword } from "@/lib/auth/password";
import { tolerancePresets } from "@/lib/analysis";

// Each demo rating starts from the first shipped preset; a lab manager edits it per rating later.
const defaultToleranceFor = () => {
  const preset = tolerancePresets[0];
  if (!preset) throw new Error("no tolerance preset is shipped");
  return structuredClone(preset);
};

try {
  const inserted = await insertDemoScenario(await hashPassword(DEMO_PASSWORD), defaultToleranceFor);
  console.log(inserted ? "demo scenario seeded" : "demo scenario already present: nothing changed");
} catch (err) {
  console.error(`seeding failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
