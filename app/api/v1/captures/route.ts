import { errorResponse } from "@/lib/auth/guards";
import { captureRegistrationSchema } from "@/lib/captures/input-schemas";
import { requireStationActor } from "@/lib/dal/actor";
import { registerCapture } from "@/lib/dal/capture-intake";
import { captureListResponse } from "@/lib/dal/capture-list";
import { readJson } from "@/lib/dal/request";

/** Bench API: registers a capture for the key's lab and bench; answers with presigned upload URL(s). */
export async function POST(request: Request) {
  try {
    const actor = await requireStationActor(request);
    const input = await readJson(request, captureRegistrationSchema);
    const result = await registerCapture(actor, input);
    return Response.json(result, { status: result.duplicate ? 200 : 201 });
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
