import "server-only";
import { eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { cleaningSystems, companySettings, sites } from "@/db/schema";
import type { Letterhead } from "@/lib/pdf/letterhead";

/**
 * The company and site a PDF prints in its header. The site is the one the record's washer stands
 * at; a record tied to no washer names the site only when the plant has just one.
 */
export async function loadLetterhead(db: Executor, systemId: string | null): Promise<Letterhead> {
  const [company] = await db
    .select({ name: companySettings.companyName })
    .from(companySettings)
    .limit(1);
  let siteName: string | null = null;
  if (systemId) {
    const [row] = await db
      .select({ name: sites.name })
      .from(cleaningSystems)
      .innerJoin(sites, eq(sites.id, cleaningSystems.siteId))
      .where(eq(cleaningSystems.id, systemId));
    siteName = row?.name ?? null;
  }
  if (!siteName) {
    const all = await db.select({ name: sites.name }).from(sites).limit(2);
    if (all.length === 1) siteName = all[0].name;
  }
  return { companyName: company?.name ?? null, siteName };
}
