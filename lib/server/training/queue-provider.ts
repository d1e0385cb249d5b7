import "server-only";
import { todayUtc } from "@/lib/format/date";
import type { QueueItem, QueueProvider } from "@/lib/server/queue/types";
import { trainingState } from "@/lib/training/rules";
import { dueTraining } from "./due-training";

/** A person's own trainings that lapse within the notice period, or have lapsed: book the retraining. */
export const trainingQueueProvider: QueueProvider = async (user, now) => {
  const today = todayUtc(now);
  const due = await dueTraining(today, user.id);
  return {
    items: due.map(({ record, label }): QueueItem => {
      const lapsed = trainingState(record.expiresOn, today) === "lapsed";
      return {
        id: `training:${record.id}`,
        kind: "Retraining",
        title: `${lapsed ? "Lapsed" : "Expires soon"}: your training on ${label}`,
        detail: lapsed
          ? `Lapsed on ${record.expiresOn}: a trainer signs off your retraining before you sign runs that cite it.`
          : `Current until ${record.expiresOn}: arrange retraining with a trainer.`,
        href: "/lab/training",
        due: `${record.expiresOn}T00:00:00.000Z`,
      };
    }),
  };
};
