import { IntentLink } from "@/components/ui/intent-link";
import { formatNumber } from "@/lib/format/number";
import type { SamplePage } from "@/lib/evidence/sample-page";

/** "Samples 51–100 of 100,000" with links to the neighbouring pages; nothing when one page holds them all. */
export function SamplePager({
  page,
  basePath,
  label,
}: {
  page: SamplePage<unknown>;
  basePath: string;
  label: string;
}) {
  if (page.pages <= 1) return null;
  const href = (n: number) => `${basePath}?samples=${n}`;
  const link =
    "rounded-md border border-stone-300 px-2 py-1 font-medium text-brand-800 hover:bg-stone-50";
  return (
    <nav aria-label={label} className="flex flex-wrap items-center gap-3 text-sm">
      <span className="tabular-nums">
        Samples {formatNumber(page.from, 0)}–{formatNumber(page.to, 0)} of{" "}
        {formatNumber(page.total, 0)} (page {formatNumber(page.page, 0)} of{" "}
        {formatNumber(page.pages, 0)})
      </span>
      {page.page > 1 && (
        <IntentLink className={link} href={href(page.page - 1)}>
          Previous samples
        </IntentLink>
      )}
      {page.page < page.pages && (
        <IntentLink className={link} href={href(page.page + 1)}>
          Next samples
        </IntentLink>
      )}
    </nav>
  );
}
