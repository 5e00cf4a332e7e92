import { z } from "zod";
import { getProfileHistory, saveProfileVersion } from "@/lib/dal/rating-profiles";
import { readJson } from "@/lib/dal/request";
import { requireApiActor, setupErrorResponse } from "@/lib/dal/setup-access";

type Params = { params: Promise<{ id: string }> };
const noStore = { "Cache-Control": "no-store" };

/** Every version of the rating's tolerance profile, newest (in force) first, with what changed. */
export async function GET(request: Request, { params }: Params) {
  try {
    const actor = await requireApiActor(request);
    const versions = await getProfileHistory(actor, (await params).id);
    return Response.json({ versions: versions.map(({ rows: _rows, ...v }) => v) }, { headers: noStore });
  } catch (err) {
    return setupErrorResponse(err);
  }
}

/** Saves a new version `{ profile, reason }`; earlier versions and the analyses judged with them stay. */
export async function POST(request: Request, { params }: Params) {
  try {
    const actor = await requireApiActor(request);
    const version = await saveProfileVersion(actor, (await params).id, await readJson(request, z.unknown()));
    return Response.json({ version }, { status: 201, headers: noStore });
  } catch (err) {
    return setupErrorResponse(err);
  }
}
