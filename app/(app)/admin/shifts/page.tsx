import type { Metadata } from "next";
import { asc } from "drizzle-orm";
import { getDb } from "@/db/client";
import { sites } from "@/db/schema";
import { ActionForm } from "@/components/ui/action-form";
import { Field } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { SubmitButton } from "@/components/ui/submit-button";
import { DEFAULT_SITE_CLOCK } from "@/lib/control-plans/schedule";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { siteClocksOf } from "@/lib/server/control-plans/site-clock";
import { saveSiteClockAction } from "./actions";

export const metadata: Metadata = { title: "Admin · Shifts" };

/** Each site's shift starts and time zone: a control plan's "per shift" and "daily" follow them. */
export default async function ShiftsPage() {
  await requirePageUser("site.manage_clock");
  const db = getDb();
  const rows = await db.select().from(sites).orderBy(asc(sites.name));
  const clocks = await siteClocksOf(
    db,
    rows.map((s) => s.id),
  );
  return (
    <>
      <PageHeader
        title="Shifts and time zone"
        description={`When each site's shifts start, in its own time zone. Per-shift tests are due once per shift, daily tests once per local day (midnight to midnight), weekly from Monday. Until saved, ${DEFAULT_SITE_CLOCK.shiftStarts.join(", ")} in ${DEFAULT_SITE_CLOCK.timeZone} apply.`}
      />
      <div className="space-y-6">
        {rows.map((site) => {
          const clock = clocks.get(site.id)!;
          return (
            <ActionForm
              key={site.id}
              action={saveSiteClockAction}
              aria-label={`Shifts of ${site.name}`}
              className="max-w-lg space-y-4 rounded-lg border border-stone-200 bg-white p-5"
            >
              <h2 className="text-lg font-semibold">{site.name}</h2>
              <input type="hidden" name="siteId" value={site.id} />
              <Field
                name="shiftStarts"
                label="Shift start times"
                defaultValue={clock.shiftStarts.join(", ")}
                hint="Local times, 24-hour, separated by commas: 06:00, 14:00, 22:00. The last shift runs to the first of the next day."
              />
              <Field
                name="timeZone"
                label="Time zone"
                defaultValue={clock.timeZone}
                hint="An IANA zone name such as Europe/Berlin: shifts keep their local times when clocks change for summer time."
              />
              <SubmitButton>Save shifts</SubmitButton>
            </ActionForm>
          );
        })}
      </div>
    </>
  );
}
