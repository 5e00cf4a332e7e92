import { z } from "zod";
import { HttpError } from "@/lib/auth/guards";
import { getCaptureInstruments, setCaptureInstruments } from "@/lib/dal/capture-instruments";
import { readJson, requireUuid } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";
import { requireApiActor } from "@/lib/dal/setup-access";

/** Replaces a capture's instruments: { "instruments": [id or asset tag, or { instrument, channel }] }. */
const captureInstrumentsBodySchema = z.object({ instruments: z.unknown() });

/** The instruments that took the capture and the overdue warnings (station key or session). */
export const GET = apiRoute(async (request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireApiActor(request);
  const summary = await getCaptureInstruments(actor, requireUuid((await params).id, "capture"));
  if (!summary) throw new HttpError(404, "No such capture");
  return Response.json(summary, { headers: { "Cache-Control": "no-store" } });
});

/** Replaces them; an unknown or retired instrument is refused with the field named (400). */
export const PUT = apiRoute(async (request: Request, { params }: { params: Promise<{ id: string }> }) => {
  const actor = await requireApiActor(request);
  const captureId = requireUuid((await params).id, "capture");
  const body = await readJson(request, captureInstrumentsBodySchema);
  return Response.json(await setCaptureInstruments(actor, captureId, body.instruments ?? []));
});
