/** Who a printout belongs to: the company and, where the record stands at one, its site. */
export interface Letterhead {
  companyName: string | null;
  siteName: string | null;
}

/**
 * "Company · Site", or whichever of the two is known; the site alone when its name already says the
 * company ("Fennmoor Fluidtech — Larchfield plant"); null when neither is known.
 */
export function letterheadLine(l: Letterhead): string | null {
  const company = l.companyName && l.siteName?.includes(l.companyName) ? null : l.companyName;
  const parts = [company, l.siteName].filter((p): p is string => !!p);
  return parts.length ? parts.join(" · ") : null;
}
