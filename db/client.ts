import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import { getEnv } from "@/lib/server/env";
import * as schema from "./schema";

// The one pool. Only db/queries/* may import this file.
export type Db = NodePgDatabase<typeof schema>;

const globalForDb = globalThis as unknown as { emfolioPool?: Pool; emfolioDb?: Db };

export function getDb(): Db {
  if (globalForDb.emfolioDb) return globalForDb.emfolioDb;
  // A connect that hangs (an unreachable host) fails after 10 s, like a refused one, so callers can retry.
  // No JIT: these are short queries, and compiling a plan cost up to 2.7 s at a million captures.
  const pool = new Pool({ connectionString: getEnv().DATABASE_URL, max: 10, connectionTimeoutMillis: 10_000, options: "-c jit=off" });
  pool.on("error", (err) => console.error("PostgreSQL pool error:", err.message));
  globalForDb.emfolioPool = pool;
  globalForDb.emfolioDb = drizzle(pool, { schema });
  return globalForDb.emfolioDb;
}

export async function closeDb(): Promise<void> {
  const pool = globalForDb.emfolioPool;
  globalForDb.emfolioPool = undefined;
  globalForDb.emfolioDb = undefined;
  await pool?.end();
}
