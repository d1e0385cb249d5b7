import { renderEmail } from "./layout";
import { formatDate } from "@/lib/format/date";

export function trainingDueEmail(input: { subject: string; expiresOn: string; lapsed: boolean }) {
  const date = formatDate(input.expiresOn);
  return renderEmail({
    subject: `${input.lapsed ? "Training lapsed" : "Retraining due"}: ${input.subject}`,
    paragraphs: [
      input.lapsed
        ? `Your training on ${input.subject} lapsed on ${date}. Until a trainer signs off your retraining you cannot sign a test run that cites it as performed.`
        : `Your training on ${input.subject} lapses on ${date}. Arrange your retraining with a trainer before then, so you can go on signing runs that cite it.`,
    ],
    link: { label: "Open the training matrix", path: "/lab/training" },
  });
}
