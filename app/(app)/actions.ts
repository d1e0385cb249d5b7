"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { getDb } from "@/db/client";
import { appendAudit } from "@/lib/audit";
import { declareEndpoint } from "@/lib/auth/endpoint-rule";
import { getCurrentUser } from "@/lib/server/auth/current-user";
import { cookieForSignOut, invalidateSession } from "@/lib/server/auth/sessions";

/** Ends the session on the server, not only in the browser. Anyone may call it: signed out, it only clears the cookie. */
export const signOutAction = declareEndpoint(
  async (): Promise<void> => {
    const user = await getCurrentUser();
    if (user) {
      await invalidateSession(user.sessionId);
      await getDb().transaction((tx) =>
        appendAudit(
          tx,
          { id: user.id, name: user.name },
          { eventType: "auth.signed_out", recordType: "user", recordId: user.id },
        ),
      );
    }
    const blank = cookieForSignOut();
    (await cookies()).set(blank.name, blank.value, blank.attributes);
    redirect("/sign-in");
  },
  { auth: "public" },
);
