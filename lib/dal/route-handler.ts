import "server-only";
import { errorResponse } from "@/lib/auth/guards";

type Handler<R extends Request, C extends unknown[]> = (request: R, ...context: C) => Promise<Response>;

/**
 * The one error boundary of route handlers: an HttpError becomes its status with a JSON message;
 * anything else is logged and answers a plain 500 (no SQL, hosts or stack traces).
 */
export function apiRoute<R extends Request, C extends unknown[]>(handler: Handler<R, C>): Handler<R, C> {
  return async (request, ...context) => {
    try {
      return await handler(request, ...context);
    } catch (err) {
      return errorResponse(err);
    }
  };
}
