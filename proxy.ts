import { getToken } from "next-auth/jwt";
import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/lib/env";

// Next 16's proxy (formerly middleware): only a convenience redirect to the sign-in page for signed-in
// areas when there is no session cookie at all. It never authorises anything: the token it reads may
// belong to an account suspended since, so every layout, server action and route handler checks the
// account itself (lib/auth/guard.ts, lib/auth/current-user.ts).

export async function proxy(request: NextRequest) {
  const token = await getToken({ req: request, secret: env.authSecret(), secureCookie: env.APP_URL.startsWith("https://") });
  if (token) return NextResponse.next();
  const signIn = new URL("/signin", request.url);
  signIn.searchParams.set("next", `${request.nextUrl.pathname}${request.nextUrl.search}`);
  return NextResponse.redirect(signIn);
}

export const config = {
  matcher: ["/workbench/:path*", "/account/:path*", "/admin/:path*", "/review/:path*"],
};
