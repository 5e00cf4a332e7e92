import "server-only";
import { errorResponse, HttpError } from "@/lib/auth/guards";
import { originAllowed } from "@/lib/auth/request-checks";
import { getEnv } from "@/lib/server/env";

type Handler<R extends Request, C extends unknown[]> = (request: R, ...context: C) => Promise<Response>;

/**
 * The one error boundary of route handlers: an HttpError becomes its status with a JSON message;
 * anything else is logged and answers a plain 500 (no SQL, hosts or stack traces). A state-changing
 * request from another origin is refused (403) before the handler runs.
 */
export function apiRoute<R extends Request, C extends unknown[]>(handler: Handler<R, C>): Handler<R, C> {
  return async (request, ...context) => {
    try {
      if (!originAllowed(request.method, request.headers, getEnv().NEXTAUTH_URL)) {
        throw new HttpError(403, "This request came from another site (Origin header); send it from the app itself.");
      }
      return await handler(request, ...context);
    } catch (err) {
      return errorResponse(err);
    }
  };
}
