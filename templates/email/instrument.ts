import { renderEmail } from "./layout";
import { formatDate } from "@/lib/format/date";

/** To the lab and quality when an instrument passes its calibration due date or a test-ink set expires. */
export function instrumentOverdueEmail(input: {
  name: string;
  assetNumber: string;
  dueOn: string;
  overdueSince: string;
  inkSet: boolean;
  instrumentId: string;
}) {
  return renderEmail({
    subject: `Overdue: ${input.inkSet ? "test-ink set" : "calibration of"} ${input.assetNumber}`,
    paragraphs: [
      input.inkSet
        ? `${input.name} passed its expiry date (${formatDate(input.dueOn)}); it is expired since ${formatDate(input.overdueSince)}.`
        : `${input.name} was due for calibration on ${formatDate(input.dueOn)}; it is overdue since ${formatDate(input.overdueSince)}.`,
      "A test run that cites it cannot be signed as performed until a calibration (or a new ink set's expiry date) is recorded.",
    ],
    link: { label: `Open ${input.assetNumber}`, path: `/instruments/${input.instrumentId}` },
  });
}
