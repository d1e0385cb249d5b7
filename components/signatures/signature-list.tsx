import { ShieldAlert, ShieldCheck } from "lucide-react";
import type { Signature } from "@/db/schema";
import { MEANING_LABELS } from "@/lib/signatures/rules";
import { formatDateTime } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

/** Signature manifestations (21 CFR 11.50): printed name, meaning, UTC date and time, bound hash. */
export function SignatureList({
  signatures,
}: {
  signatures: (Signature & { validity: "valid" | "invalid" })[];
}) {
  if (signatures.length === 0) return <p className="text-sm text-stone-600">No signatures yet.</p>;
  return (
    <Table density="compact" caption="Signatures">
      <THead>
        <Th>Meaning</Th>
        <Th>Printed name</Th>
        <Th>Signed (UTC)</Th>
        <Th>Binding</Th>
      </THead>
      <TBody>
        {signatures.map((s) => (
          <tr key={s.id}>
            <Td className="font-medium">{MEANING_LABELS[s.meaning]}</Td>
            <Td>{s.printedName}</Td>
            <Td className="tabular-nums">
              {formatDateTime(s.signedAt, { seconds: true, zone: false })}
            </Td>
            <Td title={`Signed hash ${s.contentHash}`}>
              {s.validity === "valid" ? (
                <span className="inline-flex items-center gap-1 text-brand-700">
                  <ShieldCheck className="h-4 w-4" aria-hidden="true" /> Valid
                </span>
              ) : (
                <span className="inline-flex items-center gap-1 font-medium text-red-800">
                  <ShieldAlert className="h-4 w-4" aria-hidden="true" /> Invalid: content changed
                  since signing
                </span>
              )}
            </Td>
          </tr>
        ))}
      </TBody>
    </Table>
  );
}
