import { z } from "zod";
import { setRatingRetired } from "@/lib/dal/ratings";
import { readJson } from "@/lib/dal/request";
import { requireApiActor, setupErrorResponse } from "@/lib/dal/setup-access";

const retireSchema = z.object({ retired: z.boolean({ error: "retired must be true or false" }).default(true) });

/** Retires a rating (or, with { retired: false }, brings it back); it is never deleted. */
export async function POST(request: Request, { params }: { params: Promise<{ id: string }> }) {
  try {
    const actor = await requireApiActor(request);
    const body = await readJson(request, retireSchema);
    const rating = await setRatingRetired(actor, (await params).id, body.retired);
    return Response.json({ rating }, { headers: { "Cache-Control": "no-store" } });
  } catch (err) {
    return setupErrorResponse(err);
  }
}
