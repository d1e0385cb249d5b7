import type { Redline } from "@/lib/documents/redline";

/** Insertions underlined on a tint and deletions struck through, each also named for screen readers. */
export function RedlineView({ redline }: { redline: Redline }) {
  return (
    <div
      className="rounded-lg border border-stone-200 bg-white px-6 py-4 text-sm leading-relaxed whitespace-pre-wrap"
      data-testid="redline"
    >
      {redline.segments.map((s, i) => {
        if (s.kind === "inserted")
          return (
            <ins key={i} className="bg-brand-100 text-brand-900 underline decoration-2">
              <span className="sr-only">[inserted: </span>
              {s.text}
              <span className="sr-only">]</span>
            </ins>
          );
        if (s.kind === "deleted")
          return (
            <del key={i} className="bg-stone-200 text-stone-600 line-through">
              <span className="sr-only">[deleted: </span>
              {s.text}
              <span className="sr-only">]</span>
            </del>
          );
        if (s.collapsed)
          return (
            <details
              key={i}
              className="my-1 inline-block w-full rounded bg-stone-50 px-2 text-stone-600"
            >
              <summary className="cursor-pointer text-xs">{s.words} unchanged words</summary>
              {s.text}
            </details>
          );
        return <span key={i}>{s.text}</span>;
      })}
    </div>
  );
}
