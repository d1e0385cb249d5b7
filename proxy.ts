import { NextResponse, type NextRequest } from "next/server";

/**
 * Security headers for every page: a per-request nonce so Next's own inline
 * scripts run and nothing injected does, no framing, and HTTPS pinning when
 * served over HTTPS. Authorisation is not done here: every page, action and
 * route handler checks the session and role itself.
 */
export function proxy(request: NextRequest) {
  const nonce = btoa(String.fromCharCode(...crypto.getRandomValues(new Uint8Array(16))));
  const dev = process.env.NODE_ENV !== "production";
  const https = (process.env.APP_URL ?? "").startsWith("https:");
  const csp = [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    // The rich-text editor and charts set inline style attributes.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(https ? ["upgrade-insecure-requests"] : []),
  ].join("; ");

  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("Content-Security-Policy", csp);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("Content-Security-Policy", csp);
  if (https && !dev) response.headers.set("Strict-Transport-Security", "max-age=63072000; includeSubDomains");
  // Records are confidential: never keep a signed-in page or API answer in a shared or back-forward cache.
  response.headers.set("Cache-Control", "no-store");
  return response;
}

export const config = {
  matcher: [{ source: "/((?!_next/static|_next/image|icon.svg).*)" }],
};
