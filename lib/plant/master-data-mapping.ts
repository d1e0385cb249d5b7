import {
  masterDataFields,
  masterDataNeeds,
  type MasterDataKind,
  type MasterDataMapping,
} from "./csv-master-data";

/** What stops a column mapping before the file is sent: a required field unmapped, a column gone, one column used twice. */
export function masterDataMappingProblems(
  kind: MasterDataKind,
  mapping: MasterDataMapping,
  headers: string[],
): string[] {
  const problems: string[] = [];
  for (const [key, header] of Object.entries(mapping)) {
    if (header && !headers.includes(header))
      problems.push(`The column "${header}" chosen for ${key} is not in the file.`);
  }
  const fields = masterDataFields(kind);
  for (const need of masterDataNeeds(kind)) {
    if (!mapping[need])
      problems.push(
        `No column holds ${fields.find((f) => f.key === need)!.label.toLowerCase()}: name one "${need}" or map it.`,
      );
  }
  const used = Object.values(mapping).filter(Boolean);
  const twice = used.find((h, i) => used.indexOf(h) !== i);
  if (twice) problems.push(`The column "${twice}" is mapped to two fields.`);
  return problems;
}
