import { closeDb } from "@/db/queries/connection";
import { insertDemoScenario } from "@/db/queries/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { hashPassword } from "@/lib/auth/password";

try {
  const inserted = await insertDemoScenario(await hashPassword(DEMO_PASSWORD));
  console.log(inserted ? "demo scenario seeded" : "demo scenario already present: nothing changed");
} catch (err) {
  console.error(`seeding failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeDb();
}
