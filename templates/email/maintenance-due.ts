import { renderEmail } from "./layout";
import { formatDate } from "@/lib/format/date";

export function maintenanceDueEmail(input: {
  what: string;
  tank: string;
  system: string;
  dueAt: string;
  overdue: boolean;
  stageId: string;
}) {
  const date = formatDate(input.dueAt);
  return renderEmail({
    subject: `${input.overdue ? "Overdue" : "Due"}: ${input.what.toLowerCase()} on ${input.system} ${input.tank}`,
    paragraphs: [
      input.overdue
        ? `The ${input.what.toLowerCase()} on ${input.system} · ${input.tank} was due on ${date} and has not been recorded.`
        : `The ${input.what.toLowerCase()} on ${input.system} · ${input.tank} falls due on ${date}.`,
      "Isolate the machine before a filter change and handle hot, alkaline baths as the site's safety data sheets and procedures require.",
    ],
    link: { label: "Open the bath log", path: `/evidence/bath/${input.stageId}` },
  });
}
