import Link from "next/link";

const LINKS = [
  { href: "/parts", label: "Part families" },
  { href: "/parts/specs", label: "Specification register" },
  { href: "/parts/combinations", label: "Qualified combinations" },
  { href: "/parts/import", label: "Import and export" },
] as const;

/** The sub-pages of Parts & specifications; the current one is marked for screen readers too. */
export function PartsNav({ current }: { current: (typeof LINKS)[number]["href"] }) {
  return (
    <nav aria-label="Parts & specifications" className="mb-6 flex flex-wrap gap-1 border-b border-stone-200 text-sm">
      {LINKS.map((l) => (
        <Link
          key={l.href}
          href={l.href}
          aria-current={l.href === current ? "page" : undefined}
          className={`-mb-px border-b-2 px-3 py-2 ${l.href === current ? "border-brand-700 font-medium text-stone-900" : "border-transparent text-stone-600 hover:text-stone-900"}`}
        >
          {l.label}
        </Link>
      ))}
    </nav>
  );
}

export const linkButton = "inline-flex items-center gap-1.5 rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800";
export const secondaryLink = "inline-flex items-center gap-1.5 rounded-md border border-stone-300 bg-white px-3.5 py-2 text-sm font-medium text-stone-800 hover:bg-stone-100";
