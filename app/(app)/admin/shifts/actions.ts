"use server";

import { defineAction } from "@/lib/actions/define-action";
import { siteClockSchema } from "@/lib/schemas/control-plan";
import { saveSiteClock } from "@/lib/server/control-plans/save-site-clock";

/** A site's shift start times and time zone, which per-shift and daily routine tests follow. */
export const saveSiteClockAction = defineAction({
  permission: "site.manage_clock",
  input: siteClockSchema,
  run: async ({ user, input }) => {
    await saveSiteClock(user, input);
    return { message: "Saved. Routine tests are scheduled in these shifts from now on." };
  },
  revalidate: ["/admin/shifts", "/control-plans", "/queue"],
});
