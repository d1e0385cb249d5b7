"use client";

import { IntentLink } from "@/components/ui/intent-link";
import { usePathname } from "next/navigation";

export interface SubNavItem {
  href: string;
  label: string;
  /** Path prefixes that also mark this item current; the href itself matches exactly. */
  alsoCurrentUnder?: string[];
}

export function SubNav({ label, items }: { label: string; items: SubNavItem[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label={label} className="mb-5 flex gap-1 border-b border-stone-200">
      {items.map((item) => {
        const current =
          pathname === item.href ||
          (item.alsoCurrentUnder ?? []).some((p) => pathname.startsWith(p));
        return (
          <IntentLink
            key={item.href}
            href={item.href}
            aria-current={current ? "page" : undefined}
            className={`-mb-px border-b-2 px-3 py-2 text-sm ${current ? "border-brand-700 font-medium text-brand-800" : "border-transparent text-stone-600 hover:text-stone-900"}`}
          >
            {item.label}
          </IntentLink>
        );
      })}
    </nav>
  );
}
