// Pushes the demo scenario's captures through the real intake path (storage, queue, worker), as a bench
// operator would. Idempotent: a capture whose bytes are already stored for its unit is skipped. Needs the resolve
// hook in scripts/support (server-only modules): tsx --import ./scripts/support/server-only-hook.mjs scripts/seed-captures.ts
import { createHash } from "node:crypto";
import { closeDb } from "@/db/queries/connection";
import { findActiveUserByEmail } from "@/db/queries/users";
import { listStations } from "@/db/queries/stations";
import { demoStations, demoUsers, OVERDUE_DEMO_TACHOMETER, overdueInstrumentUnits } from "@/db/seed-data";
import { actorForStoredUser } from "@/lib/dal/actor";
import { completeCaptureUpload, registerCapture } from "@/lib/dal/capture-intake";
import { closeAnalysisQueue } from "@/lib/server/queue";
import { demoCaptures } from "./demo/scenario";
import { renderDemoCsv } from "./demo/waveforms";

async function main() {
  const operatorEmail = demoUsers.find((u) => u.role === "operator")?.email;
  const row = operatorEmail ? await findActiveUserByEmail(operatorEmail) : undefined;
  if (!row) throw new Error("the demo operator is missing: run scripts/seed.ts first");
  const actor = await actorForStoredUser(row.id);
  const benches = await listStations(actor.scope);
  const benchId = (name: string) => benches.find((b) => b.name === name)?.id;
  for (const [i, c] of demoCaptures.entries()) {
    // Alternators on bay 1, PM machines on the spin rig; each takes its bench's default instruments,
    // except the PX-120 units spun with the tachometer that was past its calibration date.
    const stationId = benchId(c.testKind === "back-emf" ? demoStations[1].name : demoStations[0].name);
    const instruments = (overdueInstrumentUnits as readonly string[]).includes(c.serial) ? ["HG-OSC-07", "HG-VP-22", OVERDUE_DEMO_TACHOMETER] : undefined;
    const body = renderDemoCsv({ ...c.wave, seed: 1000 + i });
    const bytes = Buffer.from(body, "utf8");
    const { capture, upload, duplicate } = await registerCapture(actor, {
      unitSerial: c.serial, testKind: c.testKind, speedRpm: c.speedRpm, channelRoles: c.roles as never, probeScales: {}, channelOffsets: {},
      notes: c.notes, fileName: `${c.serial}-${c.testKind}.csv`, sizeBytes: bytes.length, stationId, instruments,
      sha256: createHash("sha256").update(bytes).digest("hex"),
    });
    // The same bytes for the same unit are the same capture: a second run adds nothing.
    if (duplicate && !upload) {
      console.log(`already there: ${c.serial}`);
      continue;
    }
    if (upload?.kind !== "single") throw new Error(`unexpected upload plan for ${c.serial}`);
    const put = await fetch(upload.url, { method: "PUT", headers: upload.headers, body: bytes });
    if (!put.ok) throw new Error(`upload of ${c.serial} answered ${put.status}`);
    await completeCaptureUpload(actor, capture.id, {});
    console.log(`queued ${c.serial} (${(bytes.length / 1024).toFixed(0)} KiB)`);
  }
}

try {
  await main();
} catch (err) {
  console.error(`demo captures failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await closeAnalysisQueue();
  await closeDb();
}
