import { z } from "zod";
import { readJson } from "@/lib/dal/request";
import { createRating, listRatingsView } from "@/lib/dal/ratings";
import { requireApiActor, setupErrorResponse } from "@/lib/dal/setup-access";

const noStore = { "Cache-Control": "no-store" };

/** The lab's ratings, filtered by client, machine kind and retired (session or station key). */
export async function GET(request: Request) {
  try {
    const actor = await requireApiActor(request);
    const view = await listRatingsView(actor, Object.fromEntries(new URL(request.url).searchParams));
    return Response.json({ ratings: view.ratings }, { headers: noStore });
  } catch (err) {
    return setupErrorResponse(err);
  }
}

/** A new rating with profile version 1 from a preset (lab managers and quality engineers). */
export async function POST(request: Request) {
  try {
    const actor = await requireApiActor(request);
    const rating = await createRating(actor, await readJson(request, z.unknown()));
    return Response.json({ rating }, { status: 201, headers: noStore });
  } catch (err) {
    return setupErrorResponse(err);
  }
}
