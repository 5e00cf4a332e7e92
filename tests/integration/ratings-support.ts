import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { organisations, users } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/options";

// Helpers for the lab set-up tests: seeded people as session users, and unique names per run. Each test file
// mocks next-auth's getServerSession with a settable session (vi.hoisted), so the guards see that person.

export const run = `${Date.now() % 1_000_000}`;

export const SEEDED = {
  admin: "maren.ilsley@harrowgate.example",
  operator: "tobiah.crane@harrowgate.example",
  qa: "ines.vardy@harrowgate.example",
  manufacturer: "ruan.petit@kestrum.example",
} as const;

export async function sessionUserOf(email: string): Promise<SessionUser> {
  const [row] = await getDb().select({ user: users, org: organisations }).from(users).innerJoin(organisations, eq(organisations.id, users.organisationId)).where(eq(users.email, email)).limit(1);
  if (!row) throw new Error(`no seeded user ${email}: run the test command, which seeds it`);
  return { id: row.user.id, name: row.user.name, email: row.user.email, role: row.user.role, organisationId: row.org.id, organisationName: row.org.name, organisationKind: row.org.kind };
}


/** A three-phase 400 V, 50 Hz wound-field alternator nameplate (f = p·n/120: 4 poles at 1500 rpm). */
export const alternator = {
  machineKind: "wound-field-alternator", phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1500,
  nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, ratedKva: 45,
} as const;

export const form = (fields: Record<string, string | string[]>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) for (const x of Array.isArray(v) ? v : [v]) f.append(k, x);
  return f;
};
