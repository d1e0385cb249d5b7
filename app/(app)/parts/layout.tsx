import type { ReactNode } from "react";
import { SubNav } from "@/components/shell/sub-nav";

const ITEMS = [
  { href: "/parts", label: "Part families", alsoCurrentUnder: ["/parts/families"] },
  { href: "/parts/specs", label: "Specification register", alsoCurrentUnder: ["/parts/specs/"] },
  { href: "/parts/combinations", label: "Qualified combinations" },
  { href: "/parts/import", label: "Import and export" },
];

export default function PartsLayout({ children }: { children: ReactNode }) {
  return (
    <>
      <SubNav label="Parts & specifications" items={ITEMS} />
      {children}
    </>
  );
}
