import { IntentLink } from "@/components/ui/intent-link";

/** Previous and next links under a paged list, with where the reader is. */
export function PageNav({
  label,
  page,
  pages,
  summary,
  href,
}: {
  /** The landmark's name, e.g. "Pages of the document list". */
  label: string;
  page: number;
  pages: number;
  /** What the pages hold, e.g. "10,000 documents". */
  summary: string;
  href: (page: number) => string;
}) {
  const link = "font-medium text-brand-800 underline hover:text-brand-900";
  return (
    <nav aria-label={label} className="mt-3 flex flex-wrap items-center gap-3 text-sm">
      {page > 1 && (
        <IntentLink href={href(page - 1)} className={link}>
          Previous page
        </IntentLink>
      )}
      <span>{`Page ${page.toLocaleString("en")} of ${pages.toLocaleString("en")} · ${summary}`}</span>
      {page < pages && (
        <IntentLink href={href(page + 1)} className={link}>
          Next page
        </IntentLink>
      )}
    </nav>
  );
}
