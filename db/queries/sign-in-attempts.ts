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
