import "server-only";
import { z } from "zod";
import { listReviewQueue, listUnitEvents } from "@/db/queries/unit-events";
import { requireRole, requireUser } from "@/lib/auth/guards";
import { scopeFor } from "./scope";

export async function getReviewQueueView() {
  const user = await requireRole("qa", "admin");
  return listReviewQueue(scopeFor(user));
}

export async function getUnitHistoryView(unitId: string) {
  const user = await requireUser();
  if (!z.uuid().safeParse(unitId).success) return { events: [], canDisposition: false };
  const events = await listUnitEvents(scopeFor(user), unitId);
  return { events, canDisposition: user.role === "qa" || user.role === "admin" };
}
