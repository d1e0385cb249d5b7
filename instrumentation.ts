/** Runs once when the server starts: a timer retries queued e-mail (the outbox). */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { deliverDueEmails } = await import("@/lib/email/deliver");
  const timer = setInterval(() => {
    deliverDueEmails().catch((error) => console.error("e-mail delivery failed", error));
  }, 30_000);
  timer.unref();
}
