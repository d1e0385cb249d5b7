/** Methods that change state; a browser may send them cross-site only by a form or a script. */
const UNSAFE = new Set(["POST", "PUT", "PATCH", "DELETE"]);

export interface OriginInput {
  method: string;
  origin: string | null;
  secFetchSite: string | null;
  host: string | null;
  forwardedHost: string | null;
  appUrl: string | undefined;
  hasSessionCookie: boolean;
}

/**
 * Whether a request that would act with the signed-in user's cookie came from
 * another site (cross-site request forgery). The Origin header decides when it
 * is sent ("null" from a sandboxed frame is foreign); without it, the
 * browser's Sec-Fetch-Site does. A request without the session cookie acts for
 * nobody (API clients use a bearer token), so it is not refused here.
 */
export function isCrossSiteWrite(input: OriginInput): boolean {
  if (!UNSAFE.has(input.method.toUpperCase()) || !input.hasSessionCookie) return false;
  if (input.origin !== null) {
    let host: string;
    try {
      host = new URL(input.origin).host;
    } catch {
      return true;
    }
    if (host === "") return true;
    const own = [
      input.forwardedHost,
      input.host,
      input.appUrl ? safeHost(input.appUrl) : null,
    ].filter(Boolean);
    return !own.includes(host);
  }
  return input.secFetchSite === "cross-site" || input.secFetchSite === "same-site";
}

/**
 * A read of a cookie-authenticated route under /api (an export, a download, an
 * audit pack) that a page on another site set off, by a link or an image. Such
 * reads write an audit event in the user's name, so a foreign page must not be
 * able to make one. A bookmark or a typed address sends Sec-Fetch-Site "none".
 */
export function isCrossSiteApiRead(input: {
  method: string;
  path: string;
  secFetchSite: string | null;
  hasSessionCookie: boolean;
}): boolean {
  if (UNSAFE.has(input.method.toUpperCase()) || !input.hasSessionCookie) return false;
  if (!input.path.startsWith("/api/") || input.path.startsWith("/api/v1/")) return false;
  return input.secFetchSite === "cross-site" || input.secFetchSite === "same-site";
}

function safeHost(url: string): string | null {
  try {
    return new URL(url).host;
  } catch {
    return null;
  }
}
