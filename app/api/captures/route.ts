import { errorResponse } from "@/lib/auth/guards";
import { requireSessionActor } from "@/lib/dal/actor";
import { captureRegistrationResponse } from "@/lib/dal/capture-intake";
import { captureListResponse } from "@/lib/dal/capture-list";

/** Registers a capture from the upload form; answers with presigned upload URL(s). */
export async function POST(request: Request) {
  try {
    return await captureRegistrationResponse(await requireSessionActor(), request);
  } catch (err) {
    return errorResponse(err);
  }
}

/** One page of captures: ?q=serial&state=&overall=&kind=&sort=captured|frequency|thd|vuf|ke&dir=asc|desc&page=. */
export async function GET(request: Request) {
  try {
    return await captureListResponse(await requireSessionActor(), request);
  } catch (err) {
    return errorResponse(err);
  }
}
