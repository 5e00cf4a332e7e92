import { HttpError } from "@/lib/auth/guards";
import { requireStationActor } from "@/lib/dal/actor";
import { getUnitCapturesBySerial } from "@/lib/dal/captures";
import { apiRoute } from "@/lib/dal/route-handler";

/** Bench API: a unit of the key's lab with its captures, states and verdicts. */
export const GET = apiRoute(async (request: Request, { params }: { params: Promise<{ serial: string }> }) => {
  const actor = await requireStationActor(request);
  const serial = decodeURIComponent((await params).serial).trim();
  const view = serial.length <= 64 ? await getUnitCapturesBySerial(actor, serial) : null;
  if (!view) throw new HttpError(404, `No unit with serial ${serial.slice(0, 64)} in this lab`);
  return Response.json(view, { headers: { "Cache-Control": "no-store" } });
});
