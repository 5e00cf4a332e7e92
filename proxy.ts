import { getToken } from "next-auth/jwt";
import { NextResponse, type NextRequest } from "next/server";
import { rolesForPath } from "@/lib/auth/roles";
import { getEnv } from "@/lib/server/env";

// First line of defence only: every page, action, handler and DAL function checks again.
export async function proxy(request: NextRequest) {
  const { pathname, search } = request.nextUrl;
  const token = await getToken({ req: request, secret: getEnv().NEXTAUTH_SECRET });
  if (!token) {
    const url = new URL("/sign-in", request.url);
    url.searchParams.set("next", `${pathname}${search}`);
    return NextResponse.redirect(url);
  }
  const roles = rolesForPath(pathname);
  if (roles && !roles.includes(token.role)) {
    return NextResponse.redirect(new URL("/access-denied", request.url));
  }
  return NextResponse.next();
}

export const config = {
  // Pages only: API routes answer 401/403 JSON themselves; sign-in, static files and fonts stay public.
  matcher: ["/((?!api|_next|sign-in|forgot-password|set-password|access-denied|favicon.ico|fonts|.*\\.(?:png|svg|ico|woff2|txt)$).*)"],
};
