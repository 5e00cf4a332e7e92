import { z } from "zod";
import { requireSessionActor } from "@/lib/dal/actor";
import { requestReanalysis } from "@/lib/dal/reanalysis";
import { readJson, requireUuid } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";

/** Queues a new analysis run of one capture (lab managers and quality engineers). */
export const POST = apiRoute(async (request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireSessionActor();
  const captureId = requireUuid((await params).id, "capture");
  await readJson(request, z.object({}));
  return Response.json(await requestReanalysis(actor, { captureId }), { status: 202 });
});
