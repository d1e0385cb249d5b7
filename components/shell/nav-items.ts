import type { Permission } from "@/lib/auth/permissions";

export interface NavItem {
  href: string;
  label: string;
  icon:
    | "overview"
    | "queue"
    | "systems"
    | "parts"
    | "documents"
    | "changes"
    | "evidence"
    | "nonconformances"
    | "trace"
    | "calc"
    | "admin";
  permission: Permission;
}

/** Screens are named for what the user does there. */
export const NAV_ITEMS: NavItem[] = [
  { href: "/overview", label: "Plant overview", icon: "overview", permission: "overview.view" },
  { href: "/queue", label: "My queue", icon: "queue", permission: "queue.view" },
  { href: "/systems", label: "Cleaning systems", icon: "systems", permission: "systems.view" },
  { href: "/parts", label: "Parts & specifications", icon: "parts", permission: "parts.view" },
  { href: "/documents", label: "Documents", icon: "documents", permission: "documents.view" },
  { href: "/changes", label: "Changes", icon: "changes", permission: "changes.view" },
  { href: "/deviations", label: "Deviations", icon: "changes", permission: "deviation.view" },
  { href: "/evidence", label: "Evidence", icon: "evidence", permission: "evidence.view" },
  { href: "/instruments", label: "Instruments", icon: "evidence", permission: "instrument.view" },
  { href: "/cycles", label: "Wash cycles & lots", icon: "evidence", permission: "evidence.view" },
  { href: "/lab/methods", label: "Lab methods", icon: "evidence", permission: "lab.view" },
  { href: "/lab/training", label: "Training", icon: "evidence", permission: "lab.view" },
  {
    href: "/control-plans",
    label: "Control plans",
    icon: "evidence",
    permission: "control_plan.view",
  },
  {
    href: "/nonconformances",
    label: "Nonconformances",
    icon: "nonconformances",
    permission: "nc.view",
  },
  { href: "/trace", label: "Trace", icon: "trace", permission: "trace.view" },
  { href: "/how-we-compute", label: "How we compute", icon: "calc", permission: "calc.view" },
  { href: "/admin", label: "Admin", icon: "admin", permission: "admin.view" },
];
