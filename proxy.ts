import { NextResponse, type NextRequest } from "next/server";
import { SESSION_COOKIE } from "@/lib/auth/session-cookie";
import {
  isDecodableActionBody,
  isFetchAction,
  MALFORMED_ACTION_BODY,
} from "@/lib/http/action-body";
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
export async function proxy(request: NextRequest) {
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
    }) ||
    isCrossSiteApiRead({
      method: request.method,
      path: request.nextUrl.pathname,
      secFetchSite: request.headers.get("sec-fetch-site"),
      hasSessionCookie,
    });
  if (crossSite) {
    return NextResponse.json(
      { error: "This request came from another site and was refused. Nothing was changed." },
      { status: 403, headers: { "Cache-Control": "no-store" } },
    );
  }
  if (await isMalformedPagePost(request)) {
    return NextResponse.json(
      { error: MALFORMED_ACTION_BODY },
      { status: 400, headers: { "Cache-Control": "no-store" } },
    );
  }
  const nonce = btoa(String.fromCharCode(...crypto.getRandomValues(new Uint8Array(16))));
  const { csp, hsts } = securityHeaders({
    nonce,
    dev: process.env.NODE_ENV !== "production",
    https: (process.env.APP_URL ?? "").startsWith("https:"),
  });

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

const isMultipart = (request: NextRequest) =>
  (request.headers.get("content-type") ?? "").toLowerCase().startsWith("multipart/form-data");

/**
 * A POST to a page is a server action: the framework answers a body it cannot decode with a bare
 * 500, so a broken one is refused here with a plain 400 (route handlers under /api read their own
 * bodies and answer for themselves). The body is read from a copy; the action still gets it whole.
 */
async function isMalformedPagePost(request: NextRequest): Promise<boolean> {
  if (request.method !== "POST" || request.nextUrl.pathname.startsWith("/api/")) return false;
  const fetchAction = isFetchAction(request.method, request.headers);
  if (!fetchAction && !isMultipart(request)) return false;
  try {
    if (isMultipart(request)) {
      const form = await request.clone().formData();
      // A form posted without JavaScript names its action in its fields; parsing it was the check.
      return (
        fetchAction &&
        !isDecodableActionBody({ kind: "form", fields: new Map([["0", form.get("0")]]) })
      );
    }
    return !isDecodableActionBody({ kind: "text", text: await request.clone().text() });
  } catch {
    return true;
  }
}

export const config = {
  matcher: [{ source: "/((?!_next/static|_next/image|icon.svg).*)" }],
};
