import { z } from "zod";
import { requireSessionActor } from "@/lib/dal/actor";
import { requestReanalysis } from "@/lib/dal/reanalysis";
import { readJson } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";

const bodySchema = z.object({ ratingId: z.uuid() });

/** Queues a new run of every finished capture of a rating (lab managers): after an engine upgrade or a tolerance edit. */
export const POST = apiRoute(async (request: Request) => {
  const actor = await requireSessionActor();
  const { ratingId } = await readJson(request, bodySchema);
  return Response.json(await requestReanalysis(actor, { ratingId }), { status: 202 });
});
