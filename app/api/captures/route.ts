import { errorResponse } from "@/lib/auth/guards";
import { captureRegistrationSchema } from "@/lib/captures/input-schemas";
import { requireSessionActor } from "@/lib/dal/actor";
import { registerCapture } from "@/lib/dal/capture-intake";
import { captureListResponse } from "@/lib/dal/capture-list";
import { readJson } from "@/lib/dal/request";

/** Registers a capture from the upload form; answers with presigned upload URL(s). */
export async function POST(request: Request) {
  try {
    const actor = await requireSessionActor();
    const input = await readJson(request, captureRegistrationSchema);
    const result = await registerCapture(actor, input);
    return Response.json(result, { status: result.duplicate ? 200 : 201 });
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
