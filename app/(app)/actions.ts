"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { getDb } from "@/db/client";
import { appendAudit } from "@/lib/audit";
import { getCurrentUser } from "@/lib/server/auth/current-user";
import { cookieForSignOut, invalidateSession } from "@/lib/server/auth/sessions";

/** Ends the session on the server, not only in the browser. */
export async function signOutAction(): Promise<void> {
  const user = await getCurrentUser();
  if (user) {
    await invalidateSession(user.sessionId);
    await getDb().transaction((tx) =>
      appendAudit(tx, { id: user.id, name: user.name }, { action: "auth.signed_out", recordType: "user", recordId: user.id }),
    );
  }
  const blank = cookieForSignOut();
  (await cookies()).set(blank.name, blank.value, blank.attributes);
  redirect("/sign-in");
}
