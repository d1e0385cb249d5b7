"use client";

import { IntentLink } from "@/components/ui/intent-link";
import { usePathname } from "next/navigation";
import {
  Calculator,
  ClipboardCheck,
  FileText,
  GitCompareArrows,
  History,
  Inbox,
  Settings2,
  ShowerHead,
  Boxes,
  OctagonAlert,
  Gauge,
} from "lucide-react";
import type { NavItem } from "./nav-items";

const ICONS = {
  overview: Gauge,
  queue: Inbox,
  systems: ShowerHead,
  parts: Boxes,
  documents: FileText,
  changes: GitCompareArrows,
  evidence: ClipboardCheck,
  nonconformances: OctagonAlert,
  trace: History,
  calc: Calculator,
  admin: Settings2,
} as const;

export function AppNav({ items }: { items: NavItem[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Main">
      <ul className="flex flex-row flex-wrap gap-1 lg:flex-col">
        {items.map((item) => {
          const Icon = ICONS[item.icon];
          const current = pathname === item.href || pathname.startsWith(`${item.href}/`);
          return (
            <li key={item.href}>
              <IntentLink
                href={item.href}
                aria-current={current ? "page" : undefined}
                className={`flex items-center gap-2.5 rounded-md px-3 py-2 text-sm ${
                  current
                    ? "bg-brand-700 font-medium text-white"
                    : "text-stone-700 hover:bg-stone-200/70"
                }`}
              >
                <Icon className="h-4 w-4 shrink-0" aria-hidden="true" />
                {item.label}
              </IntentLink>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
