import { closeDb as closePool } from "../client";

/** Ends the one pool, for processes that exit (scripts, the worker on shutdown, tests). */
export async function closeDb(): Promise<void> {
  await closePool();
}
