import "server-only";
import { bumpSessionVersion, countLiveSessions, endOtherSessions } from "@/db/queries/sessions";
import { requireUser } from "@/lib/auth/guards";

export async function getMySessionsView() {
  const user = await requireUser();
  return { live: await countLiveSessions(user.id) };
}

/** Ends every other session of the signed-in user (other browsers, a forgotten bench PC); this one stays. */
export async function endMyOtherSessions(): Promise<number> {
  const user = await requireUser();
  if (!user.sessionId) return 0;
  return endOtherSessions(user.id, user.sessionId);
}

/** Ends every session of the signed-in user, this one included. */
export async function signOutEverywhere(): Promise<void> {
  const user = await requireUser();
  await bumpSessionVersion(user.id);
}
