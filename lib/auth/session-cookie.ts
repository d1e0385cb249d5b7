/** The session cookie's name, in its own module so the proxy reads it without opening the database. */
export const SESSION_COOKIE = "washproof_session";
