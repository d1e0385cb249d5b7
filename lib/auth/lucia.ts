import { DrizzleSQLiteAdapter } from "@lucia-auth/adapter-drizzle";
import { Lucia, TimeSpan } from "lucia";
import { getDb } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { env } from "@/lib/env";
import { SESSION_COOKIE } from "./session-cookie";

function createLucia() {
  const config = env();
  return new Lucia(new DrizzleSQLiteAdapter(getDb(), sessions, users), {
    sessionExpiresIn: new TimeSpan(config.SESSION_IDLE_MINUTES, "m"),
    // Only validation and invalidation go through lucia: sessions are stored under the hash of
    // their token and the cookie is built in session-cookie.ts (lucia's would carry a 400-day Max-Age).
    sessionCookie: {
      name: SESSION_COOKIE,
      expires: false,
      attributes: {
        secure: config.NODE_ENV === "production" && config.APP_URL.startsWith("https:"),
        sameSite: "lax",
      },
    },
    getSessionAttributes: (a) => ({ createdAt: a.createdAt }),
    getUserAttributes: (a) => ({
      email: a.email,
      name: a.name,
      active: a.active,
      mustChangePassword: a.mustChangePassword,
    }),
  });
}

let instance: { lucia: ReturnType<typeof createLucia>; db: ReturnType<typeof getDb> } | undefined;
export function lucia() {
  // Re-created if the process database changes (tests switch between temporary files).
  if (!instance || instance.db !== getDb()) instance = { lucia: createLucia(), db: getDb() };
  return instance.lucia;
}

declare module "lucia" {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    DatabaseSessionAttributes: { createdAt: number };
    DatabaseUserAttributes: {
      email: string;
      name: string;
      active: boolean;
      mustChangePassword: boolean;
    };
  }
}
