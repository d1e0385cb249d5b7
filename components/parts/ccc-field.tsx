"use client";

import { useMemo, useState } from "react";
import { Field } from "@/components/ui/field";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { previewCleanlinessSpec } from "@/lib/specs/preview";

/**
 * The cleanliness-code field with what it means, parsed in the browser on every keystroke by the
 * same parser the server uses: the classes and limits, or the message naming the character where
 * the text goes wrong. The server still checks on save.
 */
export function CccField({ defaultValue = "" }: { defaultValue?: string }) {
  const [value, setValue] = useState(defaultValue);
  const preview = useMemo(() => previewCleanlinessSpec(value), [value]);
  return (
    <div className="space-y-2 sm:col-span-2">
      <Field
        name="ccc"
        label="Cleanliness code specification"
        value={value}
        onValueChange={setValue}
        autoComplete="off"
        spellCheck={false}
        hint="ISO 16232 / VDA 19.1 notation, e.g. A(B-E17/F-G14/H-I4/J-K2/L-N00) per 1000 cm² or N(C-E32000/H-I16/J-K0) per component."
      />
      <section
        aria-label="Parsed specification"
        aria-live="polite"
        className="rounded-md border border-stone-200 bg-stone-50 p-3 text-sm"
      >
        {preview.ok ? (
          <>
            <p className="mb-2 text-stone-700">
              Read as <span className="font-mono">{preview.text}</span>, counts {preview.basis}.
            </p>
            <Table
              caption="Parsed size classes and limits"
              density="compact"
              className="[--sticky-bg:var(--color-stone-50)]"
            >
              <THead>
                <Th>Classes</Th>
                <Th>Particle size</Th>
                <Th>Limit applies to</Th>
                <Th>Level</Th>
                <Th align="right">Largest count allowed</Th>
              </THead>
              <TBody>
                {preview.rows.map((r) => (
                  <tr key={r.text}>
                    <Td className="font-mono">{r.classes}</Td>
                    <Td>{r.sizes}</Td>
                    <Td>
                      {r.applies === "sum" ? "the sum of the classes" : "each class on its own"}
                    </Td>
                    <Td>{r.level ?? "—"}</Td>
                    <Td numeric>{r.limit}</Td>
                  </tr>
                ))}
              </TBody>
            </Table>
          </>
        ) : (
          <p className={value.trim() === "" ? "text-stone-600" : "text-red-800"}>
            {value.trim() === "" ? preview.message : `Not read: ${preview.message}`}
          </p>
        )}
      </section>
    </div>
  );
}
