/** The session cookie's name, in its own module so the proxy reads it without opening the database. */
export const SESSION_COOKIE = "washproof_session";

export interface SessionCookie {
  name: string;
  value: string;
  attributes: { httpOnly: true; sameSite: "lax"; path: "/"; secure: boolean; maxAge?: number };
}

/**
 * A browser-session cookie: no Expires and no Max-Age, so it ends when the browser
 * closes, and the server alone decides (idle and absolute limits) when the session
 * ends before that. (lucia's own cookie would carry a 400-day Max-Age here.)
 */
export function sessionCookie(token: string, secure: boolean): SessionCookie {
  return {
    name: SESSION_COOKIE,
    value: token,
    attributes: { httpOnly: true, sameSite: "lax", path: "/", secure },
  };
}

/** Clears the cookie at sign-out. */
export function blankSessionCookie(secure: boolean): SessionCookie {
  return {
    name: SESSION_COOKIE,
    value: "",
    attributes: { httpOnly: true, sameSite: "lax", path: "/", secure, maxAge: 0 },
  };
}
