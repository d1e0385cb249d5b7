import type { ReactNode } from "react";

/** An honest empty state: says what will appear here and why it is empty now. */
export function EmptyState({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="rounded-lg border border-dashed border-stone-300 bg-white px-6 py-10 text-center">
      <h2 className="text-base font-semibold text-stone-800">{title}</h2>
      <div className="mx-auto mt-2 max-w-xl text-sm text-stone-600">{children}</div>
    </section>
  );
}
