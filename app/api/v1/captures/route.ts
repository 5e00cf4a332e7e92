import { requireStationActor } from "@/lib/dal/actor";
import { captureRegistrationResponse } from "@/lib/dal/capture-intake";
import { captureListResponse } from "@/lib/dal/capture-list";
import { apiRoute } from "@/lib/dal/route-handler";

/** Bench API: registers a capture for the key's lab and bench; answers with presigned upload URL(s). */
export const POST = apiRoute(async (request: Request) => {
  return await captureRegistrationResponse(await requireStationActor(request), request);
});

/** Bench API: one page of the lab's captures, filtered and sorted like the captures page. */
export const GET = apiRoute(async (request: Request) => {
  return await captureListResponse(await requireStationActor(request), request);
});
