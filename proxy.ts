import { getToken } from "next-auth/jwt";
import { NextResponse, type NextRequest } from "next/server";
import { hasValidEscapes } from "@/lib/auth/request-checks";
import { isPublicPage, rolesForPath } from "@/lib/auth/roles";
import { getEnv } from "@/lib/server/env";

// First line of defence only: every page, action, handler and DAL function checks again.
export async function proxy(request: NextRequest) {
  const { pathname, search } = request.nextUrl;
  // A broken %-escape cannot name anything; answered here because routing would fail on it with a 500.
  if (!hasValidEscapes(pathname)) {
    return pathname.startsWith("/api/")
      ? NextResponse.json({ error: "The address has a broken %-escape" }, { status: 400 })
      : new NextResponse("Bad request: the address has a broken %-escape.", { status: 400, headers: { "content-type": "text/plain; charset=utf-8" } });
  }
  if (pathname.startsWith("/api/") || isPublicPage(pathname)) return NextResponse.next();
  const token = await getToken({ req: request, secret: getEnv().NEXTAUTH_SECRET });
  if (!token) {
    const url = new URL("/sign-in", request.url);
    url.searchParams.set("next", `${pathname}${search}`);
    return NextResponse.redirect(url);
  }
  const roles = rolesForPath(pathname);
  // Shown in place with the app's menu and a 403 status (app/(app)/refused calls forbidden()).
  if (roles && !roles.includes(token.role)) return NextResponse.rewrite(new URL("/refused", request.url));
  return NextResponse.next();
}

export const config = {
  // API routes answer 401/403 JSON themselves (the proxy only refuses broken escapes there); static files and fonts stay public.
  matcher: ["/((?!_next|favicon.ico|fonts|.*\\.(?:png|svg|ico|woff2|txt)$).*)"],
};
