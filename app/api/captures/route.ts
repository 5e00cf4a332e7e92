import { requireSessionActor } from "@/lib/dal/actor";
import { captureRegistrationResponse } from "@/lib/dal/capture-intake";
import { captureListResponse } from "@/lib/dal/capture-list";
import { apiRoute } from "@/lib/dal/route-handler";

/** Registers a capture from the upload form; answers with presigned upload URL(s). */
export const POST = apiRoute(async (request: Request) => {
  return await captureRegistrationResponse(await requireSessionActor(), request);
});

/** One page of captures: ?q=serial&state=&overall=&kind=&sort=captured|frequency|thd|vuf|ke&dir=asc|desc&page=. */
export const GET = apiRoute(async (request: Request) => {
  return await captureListResponse(await requireSessionActor(), request);
});
