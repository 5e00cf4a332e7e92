import { requireStationActor } from "@/lib/dal/actor";
import { refuseWhenBacklogFull } from "@/lib/dal/backpressure";
import { captureRegistrationResponse } from "@/lib/dal/capture-intake";
import { captureListResponse } from "@/lib/dal/capture-list";
import { apiRoute } from "@/lib/dal/route-handler";

/** Bench API: registers a capture for the key's lab and bench; answers with presigned upload URL(s), or 429 while the analysis backlog is full. */
export const POST = apiRoute(async (request: Request) => {
  const actor = await requireStationActor(request);
  await refuseWhenBacklogFull();
  return await captureRegistrationResponse(actor, request);
});

/** Bench API: one page of the lab's captures, filtered and sorted like the captures page. */
export const GET = apiRoute(async (request: Request) => {
  return await captureListResponse(await requireStationActor(request), request);
});
