"use client";

import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { ActionForm } from "@/components/ui/action-form";
import { IntentLink } from "@/components/ui/intent-link";
import { RequestRefused } from "@/lib/http/refused";
import { DateField, Field, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { TEST_TYPES } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { humanize } from "@/lib/format/labels";
import { todayUtc } from "@/lib/format/date";
import type { RunDefaults } from "@/lib/evidence/run-defaults";

export interface RunFormProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  options: {
    families: { id: string; code: string; name: string }[];
    versions: { id: string; label: string }[];
    technicians: { id: string; name: string }[];
    changes: { id: string; number: string; title: string }[];
  };
  defaultTechnicianId?: string;
  /** Filled in when the form is opened from a change request's gate. */
  defaults?: RunDefaults;
  /** Whether superseded and withdrawn versions are offered too, and the address that switches. */
  versions: { all: boolean; switchHref: string };
}

interface Protocol {
  id: string;
  number: string;
  title: string;
}

async function fetchFamilyVersions(partFamily: string, signal?: AbortSignal): Promise<string[]> {
  const qs = new URLSearchParams({ partFamily });
  const response = await fetch(`/api/evidence/family-versions?${qs}`, {
    cache: "no-store",
    signal,
  });
  const body = await response.json().catch(() => null);
  if (!response.ok) {
    const message = body?.error ?? "The family's recipe versions could not be loaded.";
    throw response.status < 500 ? new RequestRefused(message) : new Error(message);
  }
  return body.versionIds;
}

/**
 * The version choices for the chosen family: those it was run, qualified or planned with first,
 * then every other (a first run on a new combination); one list until a family is chosen.
 */
function versionChoices(
  versions: RunFormProps["options"]["versions"],
  familyCode: string | undefined,
  usedIds: string[] | undefined,
) {
  const used = new Set(usedIds ?? []);
  const all = versions.map((v) => ({ value: v.id, label: v.label }));
  if (!familyCode || used.size === 0) return { options: all, groups: [] };
  return {
    options: [],
    groups: [
      { label: `Used with ${familyCode}`, options: all.filter((v) => used.has(v.value)) },
      { label: "Other versions", options: all.filter((v) => !used.has(v.value)) },
    ].filter((g) => g.options.length > 0),
  };
}

async function fetchProtocols(
  partFamily: string,
  recipeVersion: string,
  signal?: AbortSignal,
): Promise<Protocol[]> {
  const qs = new URLSearchParams({ partFamily, recipeVersion });
  const response = await fetch(`/api/evidence/protocols?${qs}`, { cache: "no-store", signal });
  const body = await response.json().catch(() => null);
  if (!response.ok) {
    const message = body?.error ?? "The protocols could not be loaded.";
    throw response.status < 500 ? new RequestRefused(message) : new Error(message);
  }
  return body.protocols;
}

export function RunForm({
  action,
  options,
  defaultTechnicianId,
  defaults = {},
  versions,
}: RunFormProps) {
  const [familyId, setFamilyId] = useState(defaults.partFamilyId ?? "");
  const [versionId, setVersionId] = useState(defaults.recipeVersionId ?? "");
  // A version chosen from the other list (all versions, then current only) is no longer on offer.
  const combination =
    familyId !== "" &&
    options.families.some((f) => f.id === familyId) &&
    options.versions.some((v) => v.id === versionId);
  const family = options.families.find((f) => f.id === familyId);
  const usedVersions = useQuery({
    queryKey: ["run-family-versions", familyId],
    queryFn: ({ signal }) => fetchFamilyVersions(familyId, signal),
    enabled: family !== undefined,
  });
  const versionList = versionChoices(options.versions, family?.code, usedVersions.data);
  // A plant has thousands of protocols: those for the chosen family and version are asked for.
  const protocols = useQuery({
    queryKey: ["run-protocols", familyId, versionId],
    queryFn: ({ signal }) => fetchProtocols(familyId, versionId, signal),
    enabled: combination,
  });
  return (
    <ActionForm
      action={action}
      className="grid max-w-3xl gap-4 sm:grid-cols-2"
      aria-label="New test run"
    >
      <SelectField
        name="partFamilyId"
        label="Part family"
        placeholder="Choose…"
        defaultValue={defaults.partFamilyId}
        onValueChange={setFamilyId}
        options={options.families.map((f) => ({ value: f.id, label: `${f.code} · ${f.name}` }))}
      />
      <SelectField
        name="recipeVersionId"
        label="Recipe version"
        placeholder="Choose…"
        // Controlled: the options move between groups as the family changes, the choice stays.
        value={versionId}
        onValueChange={setVersionId}
        options={versionList.options}
        groups={versionList.groups}
        error={usedVersions.error?.message}
        hint={
          <>
            {versions.all
              ? "Every version, superseded and withdrawn ones too. "
              : "Versions in force, proposed or in first validation. "}
            <IntentLink href={versions.switchHref} className="text-brand-800 underline">
              {versions.all ? "Show current versions only" : "Results for an older version?"}
            </IntentLink>
          </>
        }
      />
      <SelectField
        name="testType"
        label="Test type"
        placeholder="Choose…"
        defaultValue={defaults.testType}
        options={TEST_TYPES.map((t) => ({ value: t, label: humanize(t) }))}
      />
      <SelectField
        name="technicianId"
        label="Technician"
        placeholder="Choose…"
        defaultValue={defaultTechnicianId}
        options={options.technicians.map((t) => ({ value: t.id, label: t.name }))}
      />
      <Field name="lab" label="Analysing lab" placeholder="e.g. Larchfield cleanliness lab" />
      <DateField name="performedOn" label="Test date" defaultValue={todayUtc()} />
      <SelectField
        name="protocolDocumentId"
        label="Protocol (optional)"
        placeholder="None"
        disabled={!combination}
        options={(combination ? (protocols.data ?? []) : []).map((p) => ({
          value: p.id,
          label: `${p.number} · ${p.title}`,
        }))}
        error={protocols.error?.message}
        hint={
          !combination
            ? "Choose the part family and recipe version first: the protocols for them are listed."
            : protocols.isPending
              ? "Loading the protocols for this part family and recipe version…"
              : protocols.data?.length === 0
                ? "No IQ, OQ or PQ protocol is written for this part family and recipe version."
                : undefined
        }
      />
      <SelectField
        name="changeRequestId"
        label="Change request (optional)"
        placeholder="None"
        defaultValue={defaults.changeRequestId}
        options={options.changes.map((c) => ({ value: c.id, label: `${c.number} · ${c.title}` }))}
      />
      <Field
        name="requirement"
        label="Requirement of the change request (optional)"
        className="sm:col-span-2"
        defaultValue={defaults.requirement}
        hint="The required requalification test this run answers, in the change request's words."
      />
      <div className="sm:col-span-2">
        <SubmitButton>Open test run</SubmitButton>
      </div>
    </ActionForm>
  );
}
