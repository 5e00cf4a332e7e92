import { apiReportsBySerial } from "@/lib/dal/client-api";
import { apiRoute } from "@/lib/dal/route-handler";

export const GET = apiRoute(async (request: Request) => apiReportsBySerial(request));
