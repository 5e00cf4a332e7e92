import { z } from "zod";
import { errorResponse } from "@/lib/auth/guards";
import { requireSessionActor } from "@/lib/dal/actor";
import { requestReanalysis } from "@/lib/dal/reanalysis";
import { readJson, requireUuid } from "@/lib/dal/request";

/** Queues a new analysis run of one capture (lab managers and quality engineers). */
export async function POST(request: Request, { params }: { params: Promise<{ id: string }> }) {
  try {
    const actor = await requireSessionActor();
    const captureId = requireUuid((await params).id, "capture");
    await readJson(request, z.object({}));
    return Response.json(await requestReanalysis(actor, { captureId }), { status: 202 });
  } catch (err) {
    return errorResponse(err);
  }
}
