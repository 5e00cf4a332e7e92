import { and, eq, gt, or, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { signInAttempts } from "@/db/schema";

/** Failed attempts in the window, counted separately for the account and for the client address. */
export async function countRecentFailures(email: string, address: string, windowS: number) {
  const since = sql`now() - make_interval(secs => ${windowS})`;
  const [row] = await getDb()
    .select({
      byEmail: sql<number>`count(*) filter (where ${signInAttempts.email} = ${email})`.mapWith(Number),
      byAddress: sql<number>`count(*) filter (where ${signInAttempts.address} = ${address})`.mapWith(Number),
    })
    .from(signInAttempts)
    .where(and(gt(signInAttempts.at, since), or(eq(signInAttempts.email, email), eq(signInAttempts.address, address))));
  return { byEmail: row?.byEmail ?? 0, byAddress: row?.byAddress ?? 0 };
}

export async function recordFailure(email: string, address: string): Promise<void> {
  await getDb().insert(signInAttempts).values({ email, address });
}

export async function clearFailures(email: string): Promise<void> {
  await getDb().delete(signInAttempts).where(eq(signInAttempts.email, email));
}

// Password-reset requests are counted in the same table under a marker that is never an address.
const RESET_MARKER = "#password-reset";

/** Records a forgot-password request from `address` and returns how many it made in the window, this one included. */
export async function recordResetRequest(address: string, windowS: number): Promise<number> {
  await getDb().insert(signInAttempts).values({ email: RESET_MARKER, address });
  const since = sql`now() - make_interval(secs => ${windowS})`;
  const [row] = await getDb().select({ n: sql<number>`count(*)`.mapWith(Number) }).from(signInAttempts)
    .where(and(eq(signInAttempts.email, RESET_MARKER), eq(signInAttempts.address, address), gt(signInAttempts.at, since)));
  return row?.n ?? 0;
}
