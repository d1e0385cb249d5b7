import { ShieldAlert, ShieldCheck } from "lucide-react";
import type { Signature } from "@/db/schema";
import { MEANING_LABELS } from "@/lib/signatures/rules";
import { formatDateTime } from "@/lib/format/date";

/** Signature manifestations (21 CFR 11.50): printed name, meaning, UTC date and time, bound hash. */
export function SignatureList({ signatures }: { signatures: (Signature & { validity: "valid" | "invalid" })[] }) {
  if (signatures.length === 0) return <p className="text-sm text-stone-600">No signatures yet.</p>;
  return (
    <table className="w-full text-sm">
      <caption className="sr-only">Signatures</caption>
      <thead className="text-left text-xs text-stone-500 uppercase">
        <tr>
          <th className="py-1 pr-3 font-medium">Meaning</th>
          <th className="py-1 pr-3 font-medium">Printed name</th>
          <th className="py-1 pr-3 font-medium">Signed (UTC)</th>
          <th className="py-1 font-medium">Binding</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-stone-100">
        {signatures.map((s) => (
          <tr key={s.id}>
            <td className="py-1.5 pr-3 font-medium">{MEANING_LABELS[s.meaning]}</td>
            <td className="py-1.5 pr-3">{s.printedName}</td>
            <td className="py-1.5 pr-3 tabular-nums">{formatDateTime(s.signedAt, { seconds: true, zone: false })}</td>
            <td className="py-1.5" title={`Signed hash ${s.contentHash}`}>
              {s.validity === "valid" ? (
                <span className="inline-flex items-center gap-1 text-brand-700">
                  <ShieldCheck className="h-4 w-4" aria-hidden="true" /> Valid
                </span>
              ) : (
                <span className="inline-flex items-center gap-1 font-medium text-red-800">
                  <ShieldAlert className="h-4 w-4" aria-hidden="true" /> Invalid: content changed since signing
                </span>
              )}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
