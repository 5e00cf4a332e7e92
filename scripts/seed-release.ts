// Releases the demo's first test report once the worker has analysed the demo captures: the quality
// engineer signs revision 1 for one unit whose plan is complete and within. Idempotent (a unit with a
// report is left alone). Needs the server-only hook: tsx --import ./scripts/support/server-only-hook.mjs
import { closeDb } from "@/db/queries/connection";
import { listUnitReports } from "@/db/queries/reports";
import { getUnitBySerial } from "@/db/queries/units";
import { findActiveUserByEmail } from "@/db/queries/users";
import { DEMO_PASSWORD, demoUsers } from "@/db/seed-data";
import { actorForStoredUser } from "@/lib/dal/actor";
import { releaseReport } from "@/lib/dal/releases";
import { closeAnalysisQueue } from "@/lib/server/queue";

/** A healthy KG-45T unit of the demo scenario; its one plan step is open circuit at rated speed. */
const DEMO_RELEASED_SERIAL = "KG45-260301";
const WAIT_MS = 180_000;

async function main() {
  const email = demoUsers.find((u) => u.role === "qa")?.email;
  const row = email ? await findActiveUserByEmail(email) : undefined;
  if (!row) throw new Error("the demo quality engineer is missing: run scripts/seed.ts first");
  const actor = await actorForStoredUser(row.id);
  const deadline = Date.now() + WAIT_MS;
  for (;;) {
    const unit = (await getUnitBySerial(actor.scope, DEMO_RELEASED_SERIAL))?.unit;
    if (!unit) throw new Error(`demo unit ${DEMO_RELEASED_SERIAL} is missing`);
    if ((await listUnitReports(actor.scope, unit.id)).length > 0) return console.log(`already released: ${DEMO_RELEASED_SERIAL}`);
    if (unit.planState === "complete-within") {
      const report = await releaseReport(actor, { unitId: unit.id, password: DEMO_PASSWORD }, "demo-seed");
      return console.log(`released ${report.number} revision ${report.revision} for ${DEMO_RELEASED_SERIAL}`);
    }
    if (Date.now() > deadline) throw new Error(`${DEMO_RELEASED_SERIAL} did not reach a complete plan in ${WAIT_MS / 1000} s (is the worker running?)`);
    await new Promise((r) => setTimeout(r, 2000));
  }
}

try {
  await main();
} catch (err) {
  console.error(`demo release failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeAnalysisQueue();
  await closeDb();
}
