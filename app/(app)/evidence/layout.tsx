import type { ReactNode } from "react";
import { SubNav } from "@/components/shell/sub-nav";

export default function EvidenceLayout({ children }: { children: ReactNode }) {
  return (
    <>
      <SubNav
        label="Evidence"
        items={[
          { href: "/evidence", label: "Test runs", alsoCurrentUnder: ["/evidence/runs"] },
          { href: "/evidence/trends", label: "Trends" },
          {
            href: "/evidence/bath",
            label: "Bath and filter log",
            alsoCurrentUnder: ["/evidence/bath/"],
          },
        ]}
      />
      {children}
    </>
  );
}
