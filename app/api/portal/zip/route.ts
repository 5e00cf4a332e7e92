import { downloadPortalZip } from "@/lib/dal/portal";
import { parseInput, readBounded } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";
import { zipSelectionSchema } from "@/lib/reports/portal-query";

// POST from the portal's selection form (ids=…&ids=…): the selection as one streamed zip.
export const POST = apiRoute(async (request: Request) => {
  const form = new URLSearchParams(await readBounded(request, 64 * 1024));
  const { ids } = parseInput(zipSelectionSchema, { ids: form.getAll("ids") });
  return downloadPortalZip(ids);
});
