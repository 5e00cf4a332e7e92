import { NextRequest } from "next/server";
import { createRouteHandler } from "uploadthing/next";
import { readBounded } from "@/lib/dal/request";
import { apiRoute } from "@/lib/dal/route-handler";
import { uploadRouteConfig } from "@/lib/server/uploadthing";
import { uploadRouter } from "./core";

// uploadthing's handler: GET gives the route config to the upload form, POST takes the form's
// upload requests and the store's signed callbacks. Built on first use so `next build` needs no token.
let handlers: ReturnType<typeof createRouteHandler> | undefined;
const get = () => (handlers ??= createRouteHandler({ router: uploadRouter, config: uploadRouteConfig() }));

/** Upload requests (ten files' names and sizes) and callbacks are small; the SDK would read any size. */
const MAX_BODY_BYTES = 64 * 1024;

export const GET = (request: NextRequest) => get().GET(request);

export const POST = apiRoute(async (request: NextRequest) => {
  const body = await readBounded(request, MAX_BODY_BYTES);
  const headers = new Headers(request.headers);
  headers.delete("content-length");
  return get().POST(new NextRequest(request.url, { method: "POST", headers, body }));
});
