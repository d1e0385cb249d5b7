import { NextResponse, type NextRequest } from "next/server";
import { SESSION_COOKIE } from "@/lib/auth/session-cookie";
import { isCrossSiteApiRead, isCrossSiteWrite } from "@/lib/http/origin";
import { securityHeaders } from "@/lib/http/security-headers";

/**
 * Security headers for every page: a per-request nonce so Next's own inline
 * scripts run and nothing injected does, no framing, and HTTPS pinning when
 * served over HTTPS. A state-changing request that carries the session cookie
 * but comes from another site is refused before it reaches a server action or
 * route handler, and so is a cross-site read of an audited /api route.
 * Authorisation is not done here: every page, action and route handler checks
 * the session and role itself.
 */
export function proxy(request: NextRequest) {
  const hasSessionCookie = request.cookies.has(SESSION_COOKIE);
  const crossSite =
    isCrossSiteWrite({
      method: request.method,
      origin: request.headers.get("origin"),
      secFetchSite: request.headers.get("sec-fetch-site"),
      host: request.headers.get("host"),
      forwardedHost: request.headers.get("x-forwarded-host"),
      appUrl: process.env.APP_URL,
      hasSessionCookie,
    }) || isCrossSiteApiRead({ method: request.method, path: request.nextUrl.pathname, secFetchSite: request.headers.get("sec-fetch-site"), hasSessionCookie });
  if (crossSite) {
    return NextResponse.json({ error: "This request came from another site and was refused. Nothing was changed." }, { status: 403, headers: { "Cache-Control": "no-store" } });
  }
  const nonce = btoa(String.fromCharCode(...crypto.getRandomValues(new Uint8Array(16))));
  const { csp, hsts } = securityHeaders({ nonce, dev: process.env.NODE_ENV !== "production", https: (process.env.APP_URL ?? "").startsWith("https:") });

  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("Content-Security-Policy", csp);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("Content-Security-Policy", csp);
  if (hsts) response.headers.set("Strict-Transport-Security", hsts);
  // Records are confidential: never keep a signed-in page or API answer in a shared or back-forward cache.
  response.headers.set("Cache-Control", "no-store");
  return response;
}

export const config = {
  matcher: [{ source: "/((?!_next/static|_next/image|icon.svg).*)" }],
};
