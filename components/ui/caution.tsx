import { TriangleAlert } from "lucide-react";
import type { ReactNode } from "react";

/** A safety caution: amber, always with the word "Caution" and an icon, never colour alone. */
export function Caution({ title, children }: { title: string; children: ReactNode }) {
  return (
    <aside
      role="note"
      className="flex gap-3 rounded-md border border-caution-500 bg-caution-50 px-4 py-3 text-sm text-caution-900"
    >
      <TriangleAlert className="mt-0.5 h-4 w-4 shrink-0" aria-hidden="true" />
      <div>
        <p className="font-semibold">Caution: {title}</p>
        <div className="mt-0.5">{children}</div>
        <p className="mt-1 text-xs">
          The site&apos;s safety data sheets, local codes and licensed practice govern.
        </p>
      </div>
    </aside>
  );
}
