import { errorResponse } from "@/lib/auth/guards";
import { requireStationActor } from "@/lib/dal/actor";
import { refuseWhenBacklogFull } from "@/lib/dal/backpressure";
import { captureRegistrationResponse } from "@/lib/dal/capture-intake";
import { captureListResponse } from "@/lib/dal/capture-list";

/** Bench API: registers a capture for the key's lab and bench; answers with presigned upload URL(s), or 429 while the analysis backlog is full. */
export async function POST(request: Request) {
  try {
    const actor = await requireStationActor(request);
    await refuseWhenBacklogFull();
    return await captureRegistrationResponse(actor, request);
  } catch (err) {
    return errorResponse(err);
  }
}

/** Bench API: one page of the lab's captures, filtered and sorted like the captures page. */
export async function GET(request: Request) {
  try {
    return await captureListResponse(await requireStationActor(request), request);
  } catch (err) {
    return errorResponse(err);
  }
}
