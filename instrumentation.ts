/**
 * Runs once when the server starts: a timer retries queued e-mail (the outbox),
 * reminds people of overdue document reviews and makes approved documents
 * effective on their date; another sends requalification reminders.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { deliverDueEmails } = await import("@/lib/email/deliver");
  const { notifyOverdueReviews } = await import("@/lib/server/documents/notify-overdue-reviews");
  const { makeDueVersionsEffective } = await import("@/lib/server/documents/make-effective");
  const timer = setInterval(() => {
    Promise.all([notifyOverdueReviews(), makeDueVersionsEffective()])
      .then(() => deliverDueEmails())
      .catch((error) => console.error("scheduled document and e-mail pass failed", error));
  }, 30_000);
  timer.unref();
  const { sendRequalificationReminders } = await import("@/lib/server/changes/send-requalification-reminders");
  const remind = () => sendRequalificationReminders().catch((error) => console.error("requalification reminders failed", error));
  setTimeout(remind, 5_000).unref();
  setInterval(remind, 3_600_000).unref();
}
