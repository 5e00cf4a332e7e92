import type { NextRequest } from "next/server";
import { createRouteHandler } from "uploadthing/next";
import { uploadRouteConfig } from "@/lib/server/uploadthing";
import { uploadRouter } from "./core";

// uploadthing's handler: GET gives the route config to the upload form, POST takes the form's
// upload requests and the store's signed callbacks. Built on first use so `next build` needs no token.
let handlers: ReturnType<typeof createRouteHandler> | undefined;
const get = () => (handlers ??= createRouteHandler({ router: uploadRouter, config: uploadRouteConfig() }));

export const GET = (request: NextRequest) => get().GET(request);
export const POST = (request: NextRequest) => get().POST(request);
