// Run by tests/e2e/portal.spec.ts through tsx: inserts a released report for the seeded client Kestrum
// (the release flow is built elsewhere) and queues its "released" mail. Prints { number, serial }.
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { closeDb } from "@/db/queries/connection";
import { organisations, users } from "@/db/schema";
import { closeMailQueue } from "@/lib/server/mail-queue";
import { notifyReportEvent } from "@/lib/server/mail-report-events";
import { firstUnitOf, insertReport } from "@/tests/integration/report-fixtures";

async function main() {
  const bySlug = async (slug: string) => (await getDb().select().from(organisations).where(eq(organisations.slug, slug)))[0]!;
  const lab = await bySlug("harrowgate-lab");
  const kestrum = await bySlug("kestrum");
  const [qa] = await getDb().select().from(users).where(eq(users.email, "ines.vardy@harrowgate.example"));
  const unit = await firstUnitOf(lab.id, kestrum.id);
  const number = `E2E-${Date.now() % 1_000_000}`;
  const first = await insertReport({ labId: lab.id, clientId: kestrum.id, unit, number, signerId: qa!.id });
  await insertReport({ labId: lab.id, clientId: kestrum.id, unit, number: `${number}B`, signerId: qa!.id });
  await notifyReportEvent(first.row.id, "released");
  console.log(JSON.stringify({ number, serial: unit.serial }));
  await closeMailQueue();
  await closeDb();
}

void main();
