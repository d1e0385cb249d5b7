/**
 * Runs once when the server starts: timers retry queued e-mail (the outbox), remind
 * people of overdue document reviews, make approved documents effective on their
 * date, queue bath-maintenance and requalification reminders, and sign a checkpoint
 * of the audit chain's head into the evidence store (and the auditor's mailbox).
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
  const { sendMaintenanceReminders } = await import("@/lib/server/bath/send-maintenance-reminders");
  const remind = () =>
    sendMaintenanceReminders()
      .then(({ queued }) => (queued > 0 ? deliverDueEmails() : undefined))
      .catch((error) => console.error("maintenance reminders failed", error));
  setTimeout(remind, 5_000).unref();
  setInterval(remind, 15 * 60_000).unref();
  const { sendRequalificationReminders } =
    await import("@/lib/server/changes/send-requalification-reminders");
  const remindRequalification = () =>
    sendRequalificationReminders()
      .then(() => deliverDueEmails())
      .catch((error) => console.error("requalification reminders failed", error));
  setTimeout(remindRequalification, 5_000).unref();
  setInterval(remindRequalification, 3_600_000).unref();
  const { runDeviationJob } = await import("@/lib/server/deviations/run-deviation-job");
  // Records each deviation's expiry once and reminds before the end; the pages compute expiry on read.
  const deviationPass = () =>
    runDeviationJob()
      .then(({ reminded }) => (reminded > 0 ? deliverDueEmails() : undefined))
      .catch((error) => console.error("deviation expiry and reminders failed", error));
  setTimeout(deviationPass, 5_000).unref();
  setInterval(deviationPass, 15 * 60_000).unref();
  const { sendNonconformanceReminders } =
    await import("@/lib/server/nonconformances/send-reminders");
  const remindNonconformances = () =>
    sendNonconformanceReminders()
      .then((sent) => (sent > 0 ? deliverDueEmails() : undefined))
      .catch((error) => console.error("nonconformance reminders failed", error));
  setTimeout(remindNonconformances, 5_000).unref();
  setInterval(remindNonconformances, 3_600_000).unref();
  // Retraining reminders: once per person, subject and expiry date, a month ahead.
  const { sendTrainingReminders } = await import("@/lib/server/training/send-training-reminders");
  const remindTraining = () =>
    sendTrainingReminders()
      .then(({ sent }) => (sent > 0 ? deliverDueEmails() : undefined))
      .catch((error) => console.error("training reminders failed", error));
  setTimeout(remindTraining, 5_000).unref();
  setInterval(remindTraining, 3_600_000).unref();
  // Emergency changes past their approval date are escalated once; decided effectiveness checks recorded.
  const { escalateOverdueEmergencyApprovals } =
    await import("@/lib/server/changes/escalate-emergency-approvals");
  const { recordEffectivenessOutcomes } = await import("@/lib/server/changes/effectiveness");
  const changeFollowUp = () =>
    Promise.all([escalateOverdueEmergencyApprovals(), recordEffectivenessOutcomes()])
      .then(() => deliverDueEmails())
      .catch((error) => console.error("emergency escalation or effectiveness pass failed", error));
  setTimeout(changeFollowUp, 5_000).unref();
  setInterval(changeFollowUp, 15 * 60_000).unref();
  const { sendControlPlanOverdueNotices } =
    await import("@/lib/server/control-plans/send-overdue-notices");
  // Once per line and due date: a routine test of a control plan that became overdue.
  const controlPlanPass = () =>
    sendControlPlanOverdueNotices()
      .then((sent) => (sent > 0 ? deliverDueEmails() : undefined))
      .catch((error) => console.error("control plan overdue notices failed", error));
  setTimeout(controlPlanPass, 5_000).unref();
  setInterval(controlPlanPass, 15 * 60_000).unref();
  const { sendInstrumentOverdueNotices } =
    await import("@/lib/server/instruments/send-overdue-notices");
  // Once per instrument and due date, when its calibration (or ink set) becomes overdue.
  const instrumentPass = () =>
    sendInstrumentOverdueNotices()
      .then((sent) => (sent > 0 ? deliverDueEmails() : undefined))
      .catch((error) => console.error("instrument overdue notices failed", error));
  setTimeout(instrumentPass, 5_000).unref();
  setInterval(instrumentPass, 3_600_000).unref();
  const { env } = await import("@/lib/env");
  const { writeCheckpoint } = await import("@/lib/server/audit/write-checkpoint");
  // Skipped when the head has not moved, so an idle system writes nothing.
  const checkpoint = () =>
    writeCheckpoint("schedule")
      .then((r) => (r.written && r.emailedTo ? deliverDueEmails() : undefined))
      .catch((error) => console.error("audit checkpoint failed", error));
  setTimeout(checkpoint, 10_000).unref();
  setInterval(checkpoint, env().AUDIT_CHECKPOINT_MINUTES * 60_000).unref();
}
